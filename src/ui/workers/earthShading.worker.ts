/// <reference lib="webworker" />
import { earthVisibilityStage } from '../../core/earthVisibility';

// Earth-visibility shading for the lunar globe, off the main thread.

interface Req { id: number; latStepDeg: number; lonStepDeg: number; startMs: number; endMs: number; stepMin: number }

self.onmessage = (e: MessageEvent<Req>) => {
  const { id, ...opts } = e.data;
  try {
    const st = earthVisibilityStage(opts);
    let r = st.next();
    while (!r.done) r = st.next();
    const v = r.value;
    (self as unknown as Worker).postMessage({ id, ok: true, value: v }, [v.lat_deg.buffer, v.lon_deg.buffer, v.fraction.buffer] as Transferable[]);
  } catch (err) {
    (self as unknown as Worker).postMessage({ id, ok: false, error: err instanceof Error ? err.message : String(err) });
  }
};
