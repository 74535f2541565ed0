import type { ProxySite } from './caddyfile'
import { isIP } from 'node:net'
import os from 'node:os'
import QRCode from 'qrcode'
import { z } from 'zod'
import { ConfigError } from '../../server/env'
import { isLoopback } from '../../server/loopback'

const port = z.coerce.number().int().min(1).max(65535)
const hostName = z.string().trim().toLowerCase().refine(value => isIP(value) !== 0 || /^(?=.{1,253}$)(?:[a-z0-9](?:[a-z0-9-]{0,61}[a-z0-9])?\.)*[a-z0-9](?:[a-z0-9-]{0,61}[a-z0-9])?$/.test(value), 'must be a host name or an IP address')
function list<T extends z.ZodType>(item: T) {
  return z.string().optional().transform((value, ctx) => {
    const entries = (value ?? '').split(',').map(entry => entry.trim()).filter(Boolean)
    const parsed = entries.map(entry => item.safeParse(entry))
    const bad = parsed.findIndex(result => !result.success)
    if (bad >= 0) {
      ctx.issues.push({ code: 'custom', input: value, message: `"${entries[bad]}" ${parsed[bad]!.error!.issues[0]!.message}` })
      return z.NEVER
    }
    return parsed.map(result => result.data as z.infer<T>)
  })
}

/** What `npm run serve` reads beside what `npm start` reads. */
export const ServeEnvSchema = z.object({
  /** A domain of one's own: a public certificate through Caddy's automatic HTTPS. */
  PUBLIC_DOMAIN: hostName.optional(),
  /** The venue laptop's addresses phones open (its Wi-Fi or hotspot address first); found when not given. */
  VENUE_ADDRESS: list(hostName),
  HTTPS_PORT: port.default(443),
  HTTP_PORT: port.default(80),
  /** Caddy listens on this address only (every interface when not given). */
  PROXY_BIND: z.string().refine(value => isIP(value) !== 0, 'must be an IP address').optional(),
  ACME_EMAIL: z.email({ error: 'must be an e-mail address' }).optional(),
  /** off: no Caddy here (another proxy in front, or a second instance behind this one's Caddy). */
  CADDY: z.enum(['on', 'off']).default('on'),
  /** More app instances, as host:port, that this Caddy shares requests with. */
  UPSTREAMS: list(z.string().regex(/^[\w.-]+:\d{1,5}$/, 'must be host:port')),
  DEMO_DATA: z.enum(['true', 'false']).default('false').transform(value => value === 'true'),
})
export type ServeEnv = z.infer<typeof ServeEnvSchema>

export function readServeEnv(source: NodeJS.ProcessEnv = process.env): ServeEnv {
  const parsed = ServeEnvSchema.safeParse(source)
  if (!parsed.success)
    throw new ConfigError(`Invalid configuration:\n${parsed.error.issues.map(i => `  ${i.path.join('.')}: ${i.message}`).join('\n')}`)
  return parsed.data
}

/** The machine's own IPv4 addresses on its networks (Wi-Fi, hotspot, cable), loopback left out. */
export function networkAddresses(): string[] {
  return Object.values(os.networkInterfaces()).flat().filter(entry => entry && entry.family === 'IPv4' && !entry.internal).map(entry => entry!.address)
}

/** The site Caddy serves: the public domain, or the laptop's addresses with its own authority. */
export function siteOf(serveEnv: ServeEnv, appPort: number): Omit<ProxySite, 'storageDir'> {
  const shared = { httpsPort: serveEnv.HTTPS_PORT, httpPort: serveEnv.HTTP_PORT, bind: serveEnv.PROXY_BIND, upstreams: [`127.0.0.1:${appPort}`, ...serveEnv.UPSTREAMS] }
  if (serveEnv.PUBLIC_DOMAIN) {
    if (isIP(serveEnv.PUBLIC_DOMAIN) || isLoopback(serveEnv.PUBLIC_DOMAIN) || !serveEnv.PUBLIC_DOMAIN.includes('.'))
      throw new ConfigError('PUBLIC_DOMAIN: must be a domain name that points at this server (a public certificate is issued for names, not for addresses)')
    return { ...shared, mode: 'public', hosts: [serveEnv.PUBLIC_DOMAIN], acmeEmail: serveEnv.ACME_EMAIL }
  }
  const hosts = serveEnv.VENUE_ADDRESS.length ? serveEnv.VENUE_ADDRESS : networkAddresses()
  if (hosts.length === 0)
    throw new ConfigError('VENUE_ADDRESS: this machine is on no network, so no phone can reach it: join or open the Wi-Fi first, or name the address phones open (VENUE_ADDRESS=192.168.1.20)')
  return { ...shared, mode: 'venue', hosts }
}

/** A QR code drawn with block characters, for a terminal. */
export async function terminalQr(text: string): Promise<string> {
  return QRCode.toString(text, { type: 'terminal', small: true, errorCorrectionLevel: 'M' })
}
