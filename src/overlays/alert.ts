import type { AlertOptions } from '@ionic/core/components'

/**
 * Shows an alert and resolves once it is on screen (see README: why not @ionic/vue's controller).
 * The alert's web component loads with the first alert, not with the screen that may show one.
 */
export async function presentAlert(options: AlertOptions): Promise<void> {
  return (await import('./alert-element')).showAlert(options)
}
