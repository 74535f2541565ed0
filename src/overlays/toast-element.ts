import type { ToastOptions } from '@ionic/core/components'
import { toastController } from '@ionic/core/components'
import { defineCustomElement } from '@ionic/core/components/ion-toast.js'

/** Shows a toast (see toast.ts, which loads this module with the first toast). */
export async function showToast(options: ToastOptions): Promise<HTMLIonToastElement> {
  defineCustomElement()
  const toast = await toastController.create(options)
  await toast.present()
  return toast
}
