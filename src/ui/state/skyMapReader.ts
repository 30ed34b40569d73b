import { SkyMapError, type HealpixMap } from '../../core/sky/fitsMap';
import type { SkyMapReply } from '../workers/skyMapJob';

// Reads a user's sky map in a worker (workers/skyMap.worker.ts) and resolves
// with the same HealpixMap the core reader gives; a bad file rejects with the
// reader's SkyMapError, which names the file. One worker per file, closed
// when it is done.

let nextId = 1;

export function readSkyMapInWorker(source: Blob, name: string, onProgress?: (fraction: number) => void): Promise<HealpixMap> {
  return new Promise<HealpixMap>((resolve, reject) => {
    const w = new Worker(new URL('../workers/skyMap.worker.ts', import.meta.url), { type: 'module' });
    const id = nextId++;
    w.onmessage = (e: MessageEvent<SkyMapReply>) => {
      const d = e.data;
      if (d.id !== id) return;
      if (d.kind === 'progress') { onProgress?.(d.fraction); return; }
      w.terminate();
      if (d.kind === 'done') resolve(d.map);
      else reject(new SkyMapError(d.field, d.message)); // the message names the file either way
    };
    w.onerror = (e) => { w.terminate(); reject(new SkyMapError(name, `${name} could not be read: ${e.message || 'the map reader stopped'}`)); };
    w.postMessage({ id, name, source });
  });
}
