import type { AlertOptions } from '@ionic/core/components'
import { alertController } from '@ionic/core/components'
import { defineCustomElement } from '@ionic/core/components/ion-alert.js'

/** Shows an alert (see alert.ts, which loads this module with the first alert). */
export async function showAlert(options: AlertOptions): Promise<void> {
  defineCustomElement()
  await (await alertController.create(options)).present()
}
