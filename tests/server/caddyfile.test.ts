import { spawnSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { describe, expect, it } from 'vitest'
import { caddyfileFor, siteUrl } from '../../scripts/lib/caddyfile'
import { readServeEnv, siteOf } from '../../scripts/lib/venue'

const storageDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-caddy-test-'))
const venue = { mode: 'venue' as const, hosts: ['192.168.1.20', 'lixivia.local'], httpsPort: 443, httpPort: 80, upstreams: ['127.0.0.1:8080'], storageDir }

/** Caddy's own check of a Caddyfile: adapts it and provisions every module, starting nothing. */
function caddyAccepts(caddyfile: string): { ok: boolean, said: string } {
  const file = path.join(mkdtempSync(path.join(os.tmpdir(), 'lixivia-caddyfile-')), 'Caddyfile')
  writeFileSync(file, caddyfile)
  const result = spawnSync('caddy', ['adapt', '--config', file, '--adapter', 'caddyfile', '--validate'], { encoding: 'utf8', env: { ...process.env, XDG_DATA_HOME: storageDir, XDG_CONFIG_HOME: storageDir } })
  return { ok: result.status === 0, said: result.stderr }
}

describe('the Caddyfile npm run serve writes', () => {
  it('signs a venue\'s addresses with its own authority and serves the phone page over plain HTTP', () => {
    const caddyfile = caddyfileFor(venue)
    expect(caddyfile).toContain('https://192.168.1.20, https://lixivia.local {\n\ttls internal')
    expect(caddyfile).toContain('\tskip_install_trust')
    expect(caddyfile).toContain('\tdefault_sni 192.168.1.20')
    expect(caddyfile).toContain('http://192.168.1.20, http://lixivia.local {\n\thandle /phone* {\n\t\treverse_proxy 127.0.0.1:8080 {')
    expect(caddyfile).toContain('transport http {\n\t\t\tkeepalive 4s')
    expect(caddyfile).toContain('redir https://{host}{uri} permanent')
    expect(caddyAccepts(caddyfile)).toMatchObject({ ok: true })
  })

  it('asks a public authority for a domain, with no local authority and no plain-HTTP page', () => {
    const caddyfile = caddyfileFor({ ...venue, mode: 'public', hosts: ['lixivia.kestrel-quay.test'], acmeEmail: 'crew@kestrel-quay.test' })
    expect(caddyfile).toContain('https://lixivia.kestrel-quay.test {\n\tencode zstd gzip\n\treverse_proxy 127.0.0.1:8080 {\n\t\ttransport http {\n\t\t\tkeepalive 4s\n\t\t}\n\t}\n}')
    expect(caddyfile).toContain('\temail crew@kestrel-quay.test')
    expect(caddyfile).not.toMatch(/tls internal|skip_install_trust|http:\/\//)
    expect(caddyAccepts(caddyfile)).toMatchObject({ ok: true })
  })

  it('shares requests across several app instances and skips one that is down', () => {
    const caddyfile = caddyfileFor({ ...venue, httpsPort: 8443, httpPort: 8080, upstreams: ['127.0.0.1:8081', '127.0.0.1:8082'] })
    expect(caddyfile).toContain('reverse_proxy 127.0.0.1:8081 127.0.0.1:8082 {\n\t\tlb_policy round_robin')
    expect(caddyfile).toContain('health_uri /api/v1/health')
    expect(caddyfile).toContain('health_interval 2s')
    expect(caddyfile).toContain('redir https://{host}:8443{uri} permanent')
    expect(siteUrl({ hosts: ['192.168.1.20'], httpsPort: 8443 })).toBe('https://192.168.1.20:8443/')
    expect(caddyAccepts(caddyfile)).toMatchObject({ ok: true })
  })
})

describe('the site npm run serve chooses', () => {
  it('is the public domain when PUBLIC_DOMAIN is set', () => {
    const site = siteOf(readServeEnv({ PUBLIC_DOMAIN: 'Lixivia.Kestrel-Quay.test', UPSTREAMS: '127.0.0.1:8082' }), 8081)
    expect(site).toMatchObject({ mode: 'public', hosts: ['lixivia.kestrel-quay.test'], httpsPort: 443, httpPort: 80, upstreams: ['127.0.0.1:8081', '127.0.0.1:8082'] })
  })

  it('is the venue addresses given, the first one the address people open', () => {
    expect(siteOf(readServeEnv({ VENUE_ADDRESS: '10.42.0.1, bar-laptop.local' }), 8080)).toMatchObject({ mode: 'venue', hosts: ['10.42.0.1', 'bar-laptop.local'] })
  })

  it.each([
    [{ PUBLIC_DOMAIN: '203.0.113.9' }, 'PUBLIC_DOMAIN'],
    [{ VENUE_ADDRESS: 'not an address!' }, 'VENUE_ADDRESS'],
    [{ HTTPS_PORT: '0' }, 'HTTPS_PORT'],
    [{ UPSTREAMS: '127.0.0.1' }, 'UPSTREAMS'],
  ])('refuses %o, naming the variable', (source, variable) => {
    expect(() => siteOf(readServeEnv(source), 8080)).toThrow(new RegExp(`\\b${variable}:`))
  })
})
