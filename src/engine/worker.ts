/// <reference lib="webworker" />
// The module Web Worker the app runs plans in (bundled by Vite from
// `new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' })`).
import { attachPlanWorker, type WorkerScopeLike } from './workerHost';

attachPlanWorker(self as unknown as WorkerScopeLike);
