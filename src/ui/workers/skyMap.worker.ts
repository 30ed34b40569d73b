/// <reference lib="webworker" />
import { readSkyMapMessage, type SkyMapRequest } from './skyMapJob';

// Reading and degrading a user's HEALPix FITS map off the main thread: an
// nside-2048 file is 200 MB and 50 million pixels, seconds of work that would
// otherwise freeze the page. The job itself is in skyMapJob.ts.

self.onmessage = (e: MessageEvent<SkyMapRequest>) => {
  const post = (msg: unknown, transfer: Transferable[] = []) => (self as unknown as Worker).postMessage(msg, transfer);
  void readSkyMapMessage(e.data, post);
};
