// The Caddyfile `npm run serve` writes into DATA_DIR/caddy. Pure, so its shape is tested without
// starting Caddy. Caddy (Debian's package) terminates HTTPS and hands requests to the app on
// loopback, replacing any X-Forwarded-For a client sent with the address it really came from.

export interface ProxySite {
  /**
   * venue: a certificate authority of this machine's own (Caddy's internal issuer) for the laptop's
   * addresses; public: a certificate from a public authority through Caddy's automatic HTTPS.
   */
  mode: 'venue' | 'public'
  /** Host names or IP addresses the site answers to; the first is the one people open. */
  hosts: string[]
  httpsPort: number
  httpPort: number
  /** The app instances requests are shared across, as host:port. */
  upstreams: string[]
  /** Where Caddy keeps its certificates, keys and local authority. */
  storageDir: string
  /** Only listen on this address (tests use loopback); every interface when not given. */
  bind?: string
  /** The address the public authority writes to about expiring certificates. */
  acmeEmail?: string
}

/** The path of the venue's set-up page; served over plain HTTP too, before a phone trusts anything. */
export const phonePagePath = '/phone'

/** Where Caddy's internal issuer keeps the root certificate phones are asked to trust. */
export const venueRootFile = (storageDir: string): string => `${storageDir}/pki/authorities/local/root.crt`

const quoted = (value: string): string => `"${value.replace(/["\\]/g, '\\$&')}"`
function hostPort(host: string, port: number, standard: number): string {
  const name = host.includes(':') ? `[${host}]` : host
  return port === standard ? name : `${name}:${port}`
}

/** The address people open, with the port when it is not 443. */
export function siteUrl(site: Pick<ProxySite, 'hosts' | 'httpsPort'>): string {
  return `https://${hostPort(site.hosts[0]!, site.httpsPort, 443)}/`
}

function globalOptions(site: ProxySite): string[] {
  const lines = [
    '{',
    // Nothing reconfigures this Caddy at run time: no admin endpoint to reach or to collide on.
    '\tadmin off',
    `\tstorage file_system {\n\t\troot ${quoted(site.storageDir)}\n\t}`,
    `\thttp_port ${site.httpPort}`,
    `\thttps_port ${site.httpsPort}`,
    '\tlog {\n\t\toutput stdout\n\t\tformat json\n\t}',
  ]
  if (site.bind)
    lines.push(`\tdefault_bind ${site.bind}`)
  if (site.mode === 'venue') {
    // The authority stays in DATA_DIR: phones trust it by hand, never this machine's own store.
    lines.push('\tskip_install_trust')
    // A phone that opens the laptop by its IP address sends no server name.
    lines.push(`\tdefault_sni ${site.hosts[0]}`)
    lines.push('\tpki {\n\t\tca local {\n\t\t\tname "Lixivia venue certificates"\n\t\t\troot_cn "Lixivia venue root"\n\t\t\tintermediate_cn "Lixivia venue intermediate"\n\t\t}\n\t}')
  }
  else if (site.acmeEmail) {
    lines.push(`\temail ${site.acmeEmail}`)
  }
  lines.push('}')
  return lines
}

/**
 * Caddy lets an idle connection to the app go after 4 s, before Node closes it at 5 s (its
 * keep-alive timeout): otherwise Caddy may send a request down a connection Node is closing (a 502).
 */
const transport = (indent: string): string[] => [`${indent}transport http {`, `${indent}\tkeepalive 4s`, `${indent}}`]

function proxy(site: ProxySite, indent: string): string[] {
  if (site.upstreams.length === 1)
    return [`${indent}reverse_proxy ${site.upstreams[0]} {`, ...transport(`${indent}\t`), `${indent}}`]
  // Several instances of the stateless API: each request to the next one, skipping one the health
  // route finds down (checked every 2 s); a request that could not reach an instance goes to
  // another. No passive checks: Caddy 2.6 would count its own failed retry of a request body
  // against the healthy instance. One that met an instance as it stopped gets a 502: the phone sends its push
  // again (the same mutation ids, so nothing is applied twice). Debian's Caddy 2.6 cannot replay a
  // request body itself, so it is not asked to.
  return [
    `${indent}reverse_proxy ${site.upstreams.join(' ')} {`,
    `${indent}\tlb_policy round_robin`,
    `${indent}\tlb_try_duration 5s`,
    `${indent}\tlb_try_interval 100ms`,
    `${indent}\thealth_uri /api/v1/health`,
    `${indent}\thealth_interval 2s`,
    ...transport(`${indent}\t`),
    `${indent}}`,
  ]
}

/** The whole Caddyfile for one site. */
export function caddyfileFor(site: ProxySite): string {
  if (site.hosts.length === 0 || site.upstreams.length === 0)
    throw new Error('A site needs at least one host and one upstream.')
  const https = site.hosts.map(host => `https://${hostPort(host, site.httpsPort, 443)}`).join(', ')
  const lines = [...globalOptions(site), '', `${https} {`]
  if (site.mode === 'venue')
    lines.push('\ttls internal')
  lines.push('\tencode zstd gzip', ...proxy(site, '\t'), '}')
  if (site.mode === 'venue') {
    // Plain HTTP serves the set-up page (a phone needs it before it trusts the venue's authority)
    // and sends everything else to HTTPS.
    const http = site.hosts.map(host => `http://${hostPort(host, site.httpPort, 80)}`).join(', ')
    const port = site.httpsPort === 443 ? '' : `:${site.httpsPort}`
    lines.push('', `${http} {`, `\thandle ${phonePagePath}* {`, ...proxy(site, '\t\t'), '\t}', '\thandle {', `\t\tredir https://{host}${port}{uri} permanent`, '\t}', '}')
  }
  return `${lines.join('\n')}\n`
}
