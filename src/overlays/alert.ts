import type { AlertOptions } from '@ionic/core/components'
import { alertController } from '@ionic/core/components'
import { defineCustomElement } from '@ionic/core/components/ion-alert.js'

/** Shows an alert and resolves once it is on screen (see README: why not @ionic/vue's controller). */
export async function presentAlert(options: AlertOptions): Promise<void> {
  defineCustomElement()
  await (await alertController.create(options)).present()
}
