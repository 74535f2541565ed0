import { createHash, X509Certificate } from 'node:crypto'
import { existsSync, readFileSync } from 'node:fs'
import { Router } from 'express'
import QRCode from 'qrcode'
import { phonePage } from './phone.page'

export interface PhonePageOptions {
  /** The address people open (https://…/). */
  url: string
  /** The venue authority's root certificate (PEM file), when the laptop signs its own. */
  rootFile?: string
  /** Where the page is mounted; the certificate is `${path}/lixivia-venue-root.crt`. */
  path: string
}

export const rootCertificateName = 'lixivia-venue-root.crt'

/** SHA-256 of the certificate's DER bytes, as phones and `openssl x509 -fingerprint` show it. */
export function fingerprintOf(pem: string): string {
  const der = new X509Certificate(pem).raw
  return createHash('sha256').update(der).digest('hex').toUpperCase().match(/../g)!.join(':')
}

/**
 * The page a person opens on a phone to bring it in: the address as text and as a QR code and, at
 * a venue, the laptop's root certificate with the steps to trust it on an iPhone or an Android
 * phone. Plain HTML and no script, so it works over HTTP before anything is trusted.
 */
export function phoneRoutes(options: PhonePageOptions): Router {
  const router = Router()
  const qr = QRCode.toString(options.url, { type: 'svg', margin: 2, errorCorrectionLevel: 'M', color: { dark: '#23395B', light: '#FFFFFF' } })
  const root = (): string | null => (options.rootFile && existsSync(options.rootFile) ? readFileSync(options.rootFile, 'utf8') : null)

  router.get(options.path, async (_req, res) => {
    const pem = root()
    res.setHeader('Cache-Control', 'no-cache')
    res.type('html').send(phonePage({
      url: options.url,
      qrSvg: await qr,
      certificate: pem ? { href: `${options.path}/${rootCertificateName}`, fingerprint: fingerprintOf(pem) } : null,
      venue: Boolean(options.rootFile),
    }))
  })

  router.get(`${options.path}/${rootCertificateName}`, (_req, res) => {
    const pem = root()
    if (!pem)
      return res.status(404).type('text').send('This server has a public certificate: there is nothing to install.')
    // This type is what makes iOS offer the profile and Android its certificate installer.
    res.setHeader('Content-Type', 'application/x-x509-ca-cert')
    res.setHeader('Content-Disposition', `attachment; filename="${rootCertificateName}"`)
    res.setHeader('Cache-Control', 'no-cache')
    // Bytes, not a string: Express would add a charset the installers do not expect.
    res.send(Buffer.from(pem))
  })
  return router
}
