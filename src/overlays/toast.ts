import type { ToastOptions } from '@ionic/core/components'
import { toastController } from '@ionic/core/components'
import { defineCustomElement } from '@ionic/core/components/ion-toast.js'

/** Shows a toast and resolves once it is on screen. */
export async function presentToast(options: ToastOptions): Promise<void> {
  defineCustomElement()
  await (await toastController.create(options)).present()
}
