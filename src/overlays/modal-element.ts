import type { AppContext, Component } from 'vue'
import { modalController } from '@ionic/core/components'
import { defineCustomElement } from '@ionic/core/components/ion-modal.js'
import { createVNode, render } from 'vue'

/** Opens a Vue component in an Ionic modal, rendered with the app's context (see modal.ts). */
export async function openInModal(appContext: AppContext | null, component: Component, props: Record<string, unknown>): Promise<void> {
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
