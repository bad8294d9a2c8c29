/**
 * One readLogFile of the given log in a fresh process, as the CLI does it (nothing warmed up: the columns' memory
 * comes fresh from the system, as it does for numpy.loadtxt in its own process). Prints `wallMs cpuMs rows`.
 * Spawned by import.bench.ts: `node --import tsx bench/import-once.ts <log>`.
 */
import { readLogFile } from '../src/io/read-log';

const path = process.argv[2];
if (!path) throw new Error('usage: import-once.ts <log>');
const c0 = process.cpuUsage();
const t0 = performance.now();
const { report } = await readLogFile(path);
const c = process.cpuUsage(c0);
console.log(`${performance.now() - t0} ${(c.user + c.system) / 1000} ${report.rows}`);
