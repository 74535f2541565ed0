import type { AppContext, Component } from 'vue'
import { modalController } from '@ionic/core/components'
import { defineCustomElement } from '@ionic/core/components/ion-modal.js'
import { createVNode, getCurrentInstance, render } from 'vue'

/**
 * Returns a function that opens a Vue component in an Ionic modal. Call it in setup: the component
 * is rendered with the app's context, so it sees the same stores, router and Ionic config.
 */
export function useModal(): (component: Component, props?: Record<string, unknown>) => Promise<void> {
  const appContext: AppContext | null = getCurrentInstance()?.appContext ?? null
  return async (component, props = {}) => {
    defineCustomElement()
    const host = document.createElement('div')
    // Ionic lays out a modal's header and content only inside an .ion-page element.
    host.classList.add('ion-page')
    const vnode = createVNode(component, props)
    vnode.appContext = appContext
    render(vnode, host)
    const modal = await modalController.create({ component: host })
    void modal.onDidDismiss().then(() => render(null, host))
    await modal.present()
  }
}
