// The set-up page's HTML. Our own words and the app's colours (ink blue, copper, paper); menu names
// on the phones are the ones their makers use, which differ a little from one model to another.

export interface PhonePageContent {
  url: string
  qrSvg: string
  /** The root certificate to download and its fingerprint; null when nothing is to be trusted. */
  certificate: { href: string, fingerprint: string } | null
  /** Whether this laptop signs its own certificates (venue mode). */
  venue: boolean
}

const escape = (text: string): string => text.replace(/[&<>"']/g, c => `&#${c.charCodeAt(0)};`)

const style = `
  :root { color-scheme: light dark; --ink: #23395B; --copper: #C8743A; --paper: #FAF7F2; }
  body { margin: 0; font: 17px/1.5 Nunito, system-ui, sans-serif; background: var(--paper); color: #1d2433; }
  main { max-width: 34rem; margin: 0 auto; padding: 1.25rem 1rem 3rem; }
  h1 { color: var(--ink); font-size: 1.6rem; margin: 0.5rem 0 0.75rem; }
  h2 { color: var(--ink); font-size: 1.2rem; margin: 1.75rem 0 0.5rem; }
  .address { font-size: 1.25rem; font-weight: 700; word-break: break-all; color: var(--ink); }
  .qr { width: min(16rem, 80vw); background: #fff; padding: 0.5rem; border-radius: 0.75rem; }
  .qr svg { display: block; width: 100%; height: auto; }
  a.button { display: inline-block; min-height: 48px; padding: 0.75rem 1.25rem; border-radius: 0.75rem; background: var(--ink); color: #fff; font-weight: 700; text-decoration: none; }
  ol { padding-left: 1.4rem; } li { margin: 0.35rem 0; }
  .note { border-left: 4px solid var(--copper); padding: 0.5rem 0.75rem; background: #fff; }
  code { font-size: 0.85rem; word-break: break-all; }
  @media (prefers-color-scheme: dark) { body { background: #141a24; color: #e8e4dc; } h1, h2, .address { color: #e9d2bd; } .note { background: #1f2735; } a.button { background: var(--copper); color: #141a24; } }
`

function trustSteps(certificate: NonNullable<PhonePageContent['certificate']>): string {
  return `
    <h2>1. Trust this laptop's certificate, once per phone</h2>
    <p>The laptop signs its own certificate for the crew's phones, so that Lixivia runs over HTTPS and keeps working offline. A phone has to be told to trust it.</p>
    <p><a class="button" href="${escape(certificate.href)}" data-test="download-root">Download the Lixivia venue certificate</a></p>
    <p class="note">Compare before you trust: the laptop printed this fingerprint (SHA-256) when it started.<br><code data-test="fingerprint">${escape(certificate.fingerprint)}</code></p>
    <h2>On an iPhone or iPad</h2>
    <ol>
      <li>Open this page in Safari and tap the button above; allow the download.</li>
      <li>Open <b>Settings</b>, tap <b>Profile Downloaded</b> (or <b>General → VPN &amp; Device Management</b>), choose <b>Lixivia venue root</b> and tap <b>Install</b>.</li>
      <li>Go to <b>Settings → General → About → Certificate Trust Settings</b> and switch on full trust for <b>Lixivia venue root</b>.</li>
    </ol>
    <h2>On an Android phone</h2>
    <ol>
      <li>Tap the button above; the file lands in Downloads.</li>
      <li>Open <b>Settings → Security and privacy → More security settings → Encryption and credentials → Install a certificate → CA certificate</b> (on some phones: <b>Security → Install from storage</b>).</li>
      <li>Confirm, and pick <b>${escape(certificate.href.split('/').pop() ?? '')}</b> from Downloads.</li>
    </ol>
    <p class="note">Trust only the certificate of your own crew's laptop, and remove it after the event: on an iPhone under <b>VPN &amp; Device Management</b>, on Android under <b>Encryption and credentials → User credentials</b>.</p>
    <h2>2. Open Lixivia</h2>`
}

/** The whole page. */
export function phonePage(content: PhonePageContent): string {
  const url = escape(content.url)
  const missing = content.venue && !content.certificate
    ? '<p class="note">The laptop has not made its certificate yet: reload this page in a moment.</p>'
    : ''
  const intro = content.venue
    ? '<p>Join the laptop\'s Wi-Fi or hotspot, then follow the two steps below.</p>'
    : '<p>This server has a certificate from a public authority: open the address, nothing to install.</p>'
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Bring a phone in · Lixivia</title>
<style>${style}</style>
</head>
<body>
<main>
  <h1>Bring a phone in</h1>
  ${intro}
  ${missing}
  ${content.certificate ? trustSteps(content.certificate) : '<h2>Open Lixivia</h2>'}
  <p>Scan the code with the phone's camera, or type the address:</p>
  <div class="qr" role="img" aria-label="QR code of ${url}" data-test="qr">${content.qrSvg}</div>
  <p class="address" data-test="address"><a href="${url}">${url}</a></p>
  <p>Then add Lixivia to the home screen from the browser's menu: it opens without signal and syncs when the laptop is in reach again.</p>
</main>
</body>
</html>
`
}
