import type { Plugin } from 'vite'
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'

/**
 * @ionic/vue is one module: each component's Vue wrapper is made (and its custom element
 * defined) when that module runs, so every Ionic component used on any screen is in the entry
 * chunk, before the first screen. This plugin gives each wrapper a module of its own, made from
 * @ionic/vue's own code (its `defineContainer` and the component's line), and points the app's
 * imports of a wrapper there: a component then loads with the first screen that uses it. The
 * hand-written components stay in @ionic/vue, but those no first screen needs (tab bar and its
 * buttons, icon, back button; not ion-tabs, which @ionic/vue defines after its first render) have their custom element defined by the module the app imports them through, not by
 * @ionic/vue, so the element's code (the larger part) loads with them too.
 * The e2e overlay and navigation tests guard it, as they guard the side-effect-free marking.
 */
/**
 * Shorter names for the wrappers' chunks: every route lists the chunks it preloads in the entry, so
 * a name like `_lixivia-ionic_IonSegmentButton` costs bytes before the first screen.
 */
export function chunkFileName(chunk: { name: string }): string {
  return chunk.name.startsWith('_lixivia-ionic_') ? 'assets/ion-[hash].js' : 'assets/[name]-[hash].js'
}

export function ionicComponentsApart(): Plugin {
  const source = readFileSync(createRequire(import.meta.url).resolve('@ionic/vue'), 'utf8')
  const elementModules = new Map<string, string>()
  for (const [, alias, from] of source.matchAll(/import \{ defineCustomElement(?: as (defineCustomElement\$\w+))? \} from '([^']+)';/g))
    elementModules.set(alias ?? 'defineCustomElement', from!)
  const wrappers = new Map<string, { definer: string, line: string }>()
  for (const [line, name, definer] of source.matchAll(/const (Ion\w+) = \/\*@__PURE__\*\/ defineContainer\('[\w-]+', (defineCustomElement(?:\$\w+)?)[,)][^;]*;\n/g))
    wrappers.set(name!, { definer: definer!, line: line! })
  const start = source.indexOf('const UPDATE_VALUE_EVENT')
  const end = source.indexOf('/* eslint-disable */', start)
  if (start < 0 || end < 0 || wrappers.size < 50)
    throw new Error('ionicComponentsApart: @ionic/vue no longer has the shape this plugin reads; check its dist/index.js.')
  const container = `import { defineComponent, ref, onMounted, getCurrentInstance, inject, h, withDirectives } from 'vue'\n${source.slice(start, end)}\nexport { defineContainer }\n`
  // Hand-written wrappers whose element @ionic/vue defines when they first render.
  const handWritten: Record<string, string> = {
    IonIcon: 'ionicons/components/ion-icon.js',
    IonBackButton: '@ionic/core/components/ion-back-button.js',
    IonTabBar: '@ionic/core/components/ion-tab-bar.js',
    IonTabButton: '@ionic/core/components/ion-tab-button.js',
  }
  const handAliases = Object.values(handWritten).map((from) => {
    const alias = [...elementModules].find(([, path]) => path === from)?.[0]
    if (!alias)
      throw new Error(`ionicComponentsApart: @ionic/vue no longer imports ${from}.`)
    return alias
  })
  const prefix = 'virtual:lixivia-ionic/'
  const resolved = '\0lixivia-ionic:'

  return {
    name: 'lixivia:ionic-components-apart',
    enforce: 'pre',
    resolveId(id) {
      return id.startsWith(prefix) ? resolved + id.slice(prefix.length) : null
    },
    load(id) {
      if (!id.startsWith(resolved))
        return null
      const name = id.slice(resolved.length)
      if (name === 'container')
        return container
      if (handWritten[name])
        return `import { defineCustomElement } from '${handWritten[name]}'\nimport { ${name} as wrapped } from '@ionic/vue'\ndefineCustomElement()\nexport const ${name} = wrapped\n`
      const wrapper = wrappers.get(name)!
      return `import { defineCustomElement as ${wrapper.definer} } from '${elementModules.get(wrapper.definer)}'\nimport { defineContainer } from '${prefix}container'\n${wrapper.line}export { ${name} }\n`
    },
    transform(code, id) {
      if (/[\\/]node_modules[\\/]@ionic[\\/]vue[\\/]dist[\\/]index\.js$/.test(id)) {
        let patched = code
        for (const alias of handAliases) {
          const line = patched.indexOf(`import { defineCustomElement as ${alias} } from '`)
          if (line >= 0)
            patched = patched.slice(0, line) + patched.slice(patched.indexOf('\n', line) + 1)
          patched = patched.split(`${alias}();`).join('/* defined by the module the app imports it through */')
        }
        return { code: patched, map: null }
      }
      if (id.includes('node_modules') || id.startsWith('\0') || !/\.(?:vue|ts)$/.test(id.split('?')[0]!) || !code.includes('@ionic/vue\''))
        return null
      const changed = code.replace(/import \{([^}]*)\} from '@ionic\/vue'/g, (_all, list: string) => {
        const names = list.split(',').map(part => part.trim()).filter(Boolean)
        const apart = names.filter((entry) => {
          const name = entry.split(/\s+as\s+/)[0]!
          return wrappers.has(name) || name in handWritten
        })
        const kept = names.filter(entry => !apart.includes(entry))
        return [
          ...(kept.length ? [`import { ${kept.join(', ')} } from '@ionic/vue'`] : []),
          ...apart.map(entry => `import { ${entry} } from '${prefix}${entry.split(/\s+as\s+/)[0]}'`),
        ].join(';\n')
      })
      return changed === code ? null : { code: changed, map: null }
    },
  }
}
