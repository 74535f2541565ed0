import type { ToastOptions } from '@ionic/core/components'

/**
 * Shows a toast and resolves once it is on screen, with the toast (to wait for its dismissal). The
 * toast's web component loads with the first toast, not with the screen that may show one.
 */
export async function presentToast(options: ToastOptions): Promise<HTMLIonToastElement> {
  return (await import('./toast-element')).showToast(options)
}
