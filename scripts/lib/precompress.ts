import type { Plugin } from 'vite'
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { brotliCompressSync, constants, gzipSync } from 'node:zlib'

/** Text files worth compressing; fonts (woff2) and images are compressed formats already. */
const compressible = /\.(?:js|mjs|css|html|svg|json|webmanifest|txt|ico|xml)$/
/** Below this a compressed copy saves less than its extra request-line and header cost. */
const minBytes = 1024

function filesUnder(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const file = path.join(dir, name)
    return statSync(file).isDirectory() ? filesUnder(file) : [file]
  })
}

/**
 * Writes `file.br` (brotli, quality 11) and `file.gz` (gzip, level 9) beside every text file of the
 * build, once, so the server picks one per request (server/app.ts) instead of compressing each
 * time. Runs after every other plugin has closed the bundle, so the service worker is compressed too.
 */
export function precompress(): Plugin {
  let outDir = 'dist'
  return {
    name: 'lixivia:precompress',
    apply: 'build',
    enforce: 'post',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir)
    },
    closeBundle: {
      order: 'post',
      sequential: true,
      handler() {
        for (const file of filesUnder(outDir).filter(name => compressible.test(name))) {
          const bytes = readFileSync(file)
          if (bytes.length < minBytes)
            continue
          const br = brotliCompressSync(bytes, { params: { [constants.BROTLI_PARAM_QUALITY]: 11, [constants.BROTLI_PARAM_SIZE_HINT]: bytes.length } })
          const gz = gzipSync(bytes, { level: 9 })
          if (br.length < bytes.length)
            writeFileSync(`${file}.br`, br)
          if (gz.length < bytes.length)
            writeFileSync(`${file}.gz`, gz)
        }
      },
    },
  }
}
