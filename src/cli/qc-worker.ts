/** worker_threads entry of the `qc` pool (bundled to dist/cli/qc-worker.mjs): runs QC jobs it is sent. */
import { parentPort } from 'node:worker_threads';
import { runQcJob, type QcJob } from '../io/qc-job';

parentPort?.on('message', (msg: { id: number; job: QcJob }) => {
  void runQcJob(msg.job).then((result) => parentPort?.postMessage({ id: msg.id, result }));
});
