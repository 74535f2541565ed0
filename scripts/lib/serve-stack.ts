import type { RunningCaddy } from './caddy'
import { ConfigError, parseEnv } from '../../server/env'
import { serve } from '../../server/index'
import { createLogger } from '../../server/logger'
import { isLoopback } from '../../server/loopback'
import { fingerprintOf, phoneRoutes } from '../../server/routes/phone.routes'
import { ensureClientBuilt } from './build'
import { caddyPaths, startCaddy } from './caddy'
import { phonePagePath, siteUrl, venueRootFile } from './caddyfile'
import { lifecycle } from './lifecycle'
import { loadOrCreateSecrets } from './secrets'
import { prepareDatabase, startFailure } from './stack'
import { openStackDatabase, readStackEnv, repoRoot } from './stack-env'
import { assertPortFree } from './system'
import { readServeEnv, siteOf, terminalQr } from './venue'

/** A line Caddy logged, kept as the JSON line it is (or made one), on our stdout beside our own. */
function passCaddyLine(line: string): void {
  try {
    JSON.parse(line)
    process.stdout.write(`${line}\n`)
  }
  catch {
    process.stdout.write(`${JSON.stringify({ level: 30, time: Date.now(), source: 'caddy', msg: line })}\n`)
  }
}

/**
 * `npm run serve`: the production profile. The built client and the API on loopback for Caddy
 * only, Caddy in front with HTTPS (the venue's own authority, or a public certificate for
 * PUBLIC_DOMAIN), real mail, Secure cookies, forwarded addresses believed from Caddy alone, logs as
 * JSON lines on stdout. The person at the terminal gets the address and a QR code on stderr.
 */
export async function runServeStack(): Promise<void> {
  const logger = createLogger(process.env.LOG_LEVEL ?? 'info')
  const { onStop, shutdown } = lifecycle(message => logger.warn(message))
  try {
    const stackEnv = readStackEnv()
    const serveEnv = readServeEnv()
    if (!isLoopback(stackEnv.HOST))
      throw new ConfigError(`HOST: npm run serve listens on loopback only, for Caddy; phones reach it through HTTPS_PORT (${serveEnv.HTTPS_PORT}). Leave HOST unset.`)
    if (serveEnv.CADDY === 'off' && !process.env.PUBLIC_URL)
      throw new ConfigError('PUBLIC_URL: is required with CADDY=off: the https:// address the proxy in front serves')
    const { dataDir } = stackEnv
    const secrets = loadOrCreateSecrets(dataDir)
    ensureClientBuilt(repoRoot, { log: line => logger.info(line), quiet: true })
    await assertPortFree(stackEnv.PORT, 'PORT', stackEnv.HOST)
    const site = serveEnv.CADDY === 'on' ? siteOf(serveEnv, stackEnv.PORT) : undefined
    const storage = caddyPaths(dataDir).storage

    const database = await openStackDatabase(stackEnv, secrets.dbPassword, {
      log: line => logger.info(line),
      onGiveUp: (reason) => {
        logger.fatal(`Lixivia stops: ${reason}`)
        void shutdown(1)
      },
    })
    onStop(database.stop)
    const env = parseEnv({
      JWT_SECRET: secrets.jwtSecret,
      // Caddy connects from loopback; nobody else's X-Forwarded-For is believed.
      TRUST_PROXY: '127.0.0.1',
      ...process.env,
      ...(site && !process.env.PUBLIC_URL ? { PUBLIC_URL: siteUrl(site) } : {}),
      NODE_ENV: 'production',
      DATABASE_URL: database.url,
      DATA_DIR: dataDir,
      HOST: stackEnv.HOST,
      PORT: String(stackEnv.PORT),
    })
    const seeded = await prepareDatabase(env, { demo: serveEnv.DEMO_DATA })
    const rootFile = site?.mode === 'venue' ? venueRootFile(storage) : undefined
    const server = await serve(env, { checkServices: true, pages: phoneRoutes({ url: env.PUBLIC_URL, rootFile, path: phonePagePath }) })
    onStop(() => server.close())
    logger.info({ app: server.url, mail: `${env.SMTP_HOST}:${env.SMTP_PORT}`, demo: seeded }, 'The app listens on loopback for the proxy')

    let caddy: RunningCaddy | undefined
    if (site) {
      caddy = await startCaddy(dataDir, site, passCaddyLine)
      onStop(() => caddy!.stop())
    }
    const fingerprint = caddy?.rootCertificate ? fingerprintOf(caddy.rootCertificate) : undefined
    const setup = site?.mode === 'venue' ? `http://${site.hosts[0]}${site.httpPort === 80 ? '' : `:${site.httpPort}`}${phonePagePath}` : `${env.PUBLIC_URL}${phonePagePath.slice(1)}`
    // For the person at the terminal, beside the JSON lines: where phones go, and a code to scan.
    const scan = site?.mode === 'venue' ? setup : env.PUBLIC_URL
    process.stderr.write([
      '',
      `Lixivia is ready at ${env.PUBLIC_URL}  (Ctrl-C stops it)`,
      site?.mode === 'venue' ? `A new phone: scan this code or open ${setup} to trust this laptop's certificate and open Lixivia.` : 'Scan this code with a phone to open Lixivia:',
      fingerprint ? `Certificate fingerprint (SHA-256), as the phone page shows it: ${fingerprint}` : '',
      await terminalQr(scan),
    ].filter(Boolean).join('\n'))
    logger.info({ url: env.PUBLIC_URL, phonePage: setup, mode: site?.mode ?? 'behind another proxy', rootFingerprint: fingerprint }, 'Lixivia is ready')
  }
  catch (error) {
    logger.fatal(startFailure(error))
    await shutdown(1)
  }
}
