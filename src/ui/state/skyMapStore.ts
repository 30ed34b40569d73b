// The user's sky maps (HEALPix FITS bytes) kept in the browser's IndexedDB,
// keyed by file name as the scenario's `sky.maps[].file` names them: local
// storage is far too small for a map, and a share link carries only the name.

const DB = 'swathe-sky-maps';
const STORE = 'maps';

function open(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    if (typeof indexedDB === 'undefined') { reject(new Error("this browser offers no IndexedDB storage")); return; }
    const req = indexedDB.open(DB, 1);
    req.onupgradeneeded = () => { req.result.createObjectStore(STORE); };
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB could not be opened'));
    req.onblocked = () => reject(new Error('IndexedDB is blocked by another tab of this page'));
  });
}

/** True when the error is the browser's storage quota (named differently across browsers). */
export function isQuotaError(e: unknown): boolean {
  const n = (e as { name?: string } | null)?.name ?? '';
  return n === 'QuotaExceededError' || n === 'NS_ERROR_DOM_QUOTA_REACHED' || /quota/i.test(String((e as Error)?.message ?? ''));
}

/** Stores a map's bytes (the picked File itself, not a copy in memory) under its name, replacing one of the same name. */
export async function putSkyMap(name: string, bytes: Blob | Uint8Array): Promise<void> {
  const db = await open();
  try {
    await new Promise<void>((resolve, reject) => {
      const tx = db.transaction(STORE, 'readwrite');
      tx.objectStore(STORE).put(bytes instanceof Blob ? bytes : new Blob([bytes as BlobPart]), name);
      tx.oncomplete = () => resolve();
      tx.onerror = () => reject(tx.error);
      tx.onabort = () => reject(tx.error ?? new Error('the write was aborted'));
    });
  } finally {
    db.close();
  }
}

/** A stored map's bytes as a Blob (read in the map worker), or null when this browser does not hold it. */
export async function getSkyMap(name: string): Promise<Blob | null> {
  const db = await open();
  try {
    const v = await new Promise<unknown>((resolve, reject) => {
      const req = db.transaction(STORE, 'readonly').objectStore(STORE).get(name);
      req.onsuccess = () => resolve(req.result);
      req.onerror = () => reject(req.error);
    });
    if (v instanceof Blob) return v;
    if (v instanceof ArrayBuffer) return new Blob([v]);
    return null;
  } finally {
    db.close();
  }
}
