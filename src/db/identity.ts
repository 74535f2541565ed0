import type { CachedIdentity } from './database'

/**
 * Who was signed in on this phone, read with IndexedDB itself rather than Dexie, so a phone nobody
 * has signed in on shows the sign-in screen without loading the database code. A phone that never
 * opened the app has no database: the read makes none (the upgrade it would start is aborted).
 */
export function readCachedIdentity(name = 'lixivia'): Promise<CachedIdentity | undefined> {
  return new Promise((resolve) => {
    let request: IDBOpenDBRequest
    try {
      request = indexedDB.open(name)
    }
    catch {
      return resolve(undefined)
    }
    request.onupgradeneeded = () => request.transaction?.abort()
    request.onerror = () => resolve(undefined)
    request.onblocked = () => resolve(undefined)
    request.onsuccess = () => {
      const idb = request.result
      if (!idb.objectStoreNames.contains('identity')) {
        idb.close()
        return resolve(undefined)
      }
      const get = idb.transaction('identity', 'readonly').objectStore('identity').get('current')
      get.onsuccess = () => {
        idb.close()
        resolve(get.result as CachedIdentity | undefined)
      }
      get.onerror = () => {
        idb.close()
        resolve(undefined)
      }
    }
  })
}
