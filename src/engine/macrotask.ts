/**
 * One turn of the event loop (a macrotask, so timers, messages and abort
 * signals get their chance): setImmediate in Node, a MessageChannel message in
 * browsers and workers (setTimeout(0) is clamped to 4 ms there), else setTimeout.
 */
export const macrotask: () => Promise<void> = (() => {
  const g = globalThis as { setImmediate?: (f: () => void) => unknown };
  if (typeof g.setImmediate === 'function') return () => new Promise<void>((r) => g.setImmediate!(r));
  if (typeof MessageChannel === 'function') {
    const ch = new MessageChannel();
    const queue: (() => void)[] = [];
    ch.port1.onmessage = () => queue.shift()?.();
    return () => new Promise<void>((r) => { queue.push(r); ch.port2.postMessage(0); });
  }
  return () => new Promise<void>((r) => setTimeout(r, 0));
})();
