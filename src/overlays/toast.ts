import type { ToastOptions } from '@ionic/core/components'
import { toastController } from '@ionic/core/components'
import { defineCustomElement } from '@ionic/core/components/ion-toast.js'

/** Shows a toast and resolves once it is on screen, with the toast (to wait for its dismissal). */
export async function presentToast(options: ToastOptions): Promise<HTMLIonToastElement> {
  defineCustomElement()
  const toast = await toastController.create(options)
  await toast.present()
  return toast
}
