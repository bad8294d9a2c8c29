/**
 * Runs QC jobs on a pool of min(cores, n) worker threads running the bundled `qc-worker.mjs`,
 * or in-process when the bundle is absent (tests run from source) or one worker is asked for.
 * Results are delivered in completion order through `onResult` and returned in job order.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { runQcJob, type QcJob, type QcJobResult } from '../io/qc-job';

/** The bundled worker next to the running bundle, or null when running from source. */
export function bundledWorkerUrl(): URL | null {
  const url = new URL('./qc-worker.mjs', import.meta.url);
  try {
    return url.protocol === 'file:' && existsSync(fileURLToPath(url)) ? url : null;
  } catch {
    return null;
  }
}

export interface PoolOptions {
  /** Upper bound on workers; default the available cores. */
  maxWorkers?: number;
  workerUrl?: URL | null;
  onResult?: (index: number, result: QcJobResult) => void;
}

export async function runQcPool(jobs: readonly QcJob[], opts: PoolOptions = {}): Promise<{ results: QcJobResult[]; workers: number }> {
  const results: QcJobResult[] = new Array(jobs.length);
  const url = opts.workerUrl === undefined ? bundledWorkerUrl() : opts.workerUrl;
  const n = Math.max(1, Math.min(opts.maxWorkers ?? availableParallelism(), jobs.length));
  const deliver = (i: number, r: QcJobResult): void => {
    results[i] = r;
    opts.onResult?.(i, r);
  };
  if (!url || n === 1) {
    for (let i = 0; i < jobs.length; i++) deliver(i, await runQcJob(jobs[i] as QcJob));
    return { results, workers: 0 };
  }
  let next = 0;
  const startWorker = (): Promise<void> =>
    new Promise<void>((resolveWorker) => {
      const worker = new Worker(url);
      let current = -1;
      const feed = (): void => {
        if (next >= jobs.length) {
          current = -1;
          void worker.terminate().then(() => resolveWorker());
          return;
        }
        current = next++;
        worker.postMessage({ id: current, job: jobs[current] });
      };
      worker.on('message', (msg: { id: number; result: QcJobResult }) => {
        deliver(msg.id, msg.result);
        feed();
      });
      worker.on('error', (err) => {
        // The worker died: report its job as failed and carry on with a fresh worker.
        if (current >= 0) deliver(current, { ok: false, displayPath: (jobs[current] as QcJob).displayPath, message: `worker failed: ${err.message}`, inputError: false });
        current = -1;
        void startWorker().then(resolveWorker);
      });
      feed();
    });
  await Promise.all(Array.from({ length: n }, startWorker));
  return { results, workers: n };
}
