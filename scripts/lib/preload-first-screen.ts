import type { Plugin } from 'vite'

/**
 * Lists the chunks of the sign-in screen (the first screen of a new phone) in index.html as
 * `modulepreload`, so the browser fetches them beside the entry instead of after it has run the
 * router and the session check: one round trip instead of three on a slow connection. They are a
 * few kilobytes (`npm run size` counts them); a signed-in phone has them precached anyway.
 */
export function preloadFirstScreen(modules: string[]): Plugin {
  return {
    name: 'lixivia:preload-first-screen',
    apply: 'build',
    enforce: 'post',
    transformIndexHtml: {
      order: 'post',
      handler(html, ctx) {
        const bundle = ctx.bundle
        if (!bundle)
          return html
        const chunks = Object.values(bundle).flatMap(output => (output.type === 'chunk' ? [output] : []))
        const files = new Set<string>()
        const add = (file: string): void => {
          if (files.has(file))
            return
          files.add(file)
          chunks.find(chunk => chunk.fileName === file)?.imports.forEach(add)
        }
        for (const chunk of chunks) {
          if (chunk.facadeModuleId && modules.some(module => chunk.facadeModuleId!.endsWith(module)))
            add(chunk.fileName)
        }
        const already = [...html.matchAll(/(?:src|href)="\/([^"]+)"/g)].map(match => match[1])
        const tags = [...files].filter(file => !already.includes(file)).map(file => ({ tag: 'link', attrs: { rel: 'modulepreload', crossorigin: true, href: `/${file}` }, injectTo: 'head' as const }))
        return { html, tags }
      },
    },
  }
}
