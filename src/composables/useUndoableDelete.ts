import type { EntityName } from '../../shared/schemas/entities'
import { db } from '../db/database'
import { presentToast } from '../overlays/toast'
import { useSyncStore } from '../stores/sync'
import { deleteRecord } from '../sync/outbox'

/**
 * Deletes a record at once and offers to undo it for a few seconds. The delete is sent when the
 * offer closes, so an undo usually never reaches the server; if it already went, the undo is a
 * restore and the record's history shows both.
 */
export function useUndoableDelete() {
  const sync = useSyncStore()
  return async (entity: EntityName, id: string, options: { what: string, reason?: string }): Promise<void> => {
    const undo = await deleteRecord(db, entity, id, { reason: options.reason })
    let undone = false
    const toast = await presentToast({
      message: `${options.what} was deleted. Undo brings it back.`,
      duration: 6000,
      position: 'top',
      cssClass: 'lx-toast-undo',
      buttons: [{ text: 'Undo', handler: () => {
        undone = true
        void undo().then(() => sync.syncNow())
      } }],
    })
    void toast.onDidDismiss().then(() => {
      if (!undone)
        void sync.syncNow()
    })
  }
}
