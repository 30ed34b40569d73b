import { readHealpixFits, SkyMapError, type HealpixMap } from '../../core/sky/fitsMap';

// The sky-map worker's job, as a function of its message and a way to post
// back, so a unit test runs the same code the worker runs. The file's bytes
// are read here from the Blob (a File, or what IndexedDB gave back), so the
// main thread never holds the whole file.

export interface SkyMapRequest { id: number; name: string; source: Blob | ArrayBuffer }

export type SkyMapReply =
  | { id: number; kind: 'progress'; fraction: number }
  | { id: number; kind: 'done'; map: HealpixMap }
  | { id: number; kind: 'error'; skyMap: boolean; field: string; message: string };

/** Progress is posted at most every this many fractions of the file (keeps the message queue short). */
const PROGRESS_STEP = 0.02;

export async function readSkyMapMessage(req: SkyMapRequest, post: (msg: SkyMapReply, transfer?: Transferable[]) => void): Promise<void> {
  const { id, name } = req;
  try {
    const buf = req.source instanceof ArrayBuffer ? req.source : await req.source.arrayBuffer();
    let last = 0;
    const map = readHealpixFits(new Uint8Array(buf), name, undefined, (f) => {
      if (f - last >= PROGRESS_STEP || f === 1) { last = f; post({ id, kind: 'progress', fraction: f }); }
    });
    post({ id, kind: 'done', map }, [map.values.buffer as ArrayBuffer]);
  } catch (e) {
    post(e instanceof SkyMapError
      ? { id, kind: 'error', skyMap: true, field: e.field, message: e.message }
      : { id, kind: 'error', skyMap: false, field: name, message: `${name} could not be read: ${e instanceof Error ? e.message : String(e)}` });
  }
}
