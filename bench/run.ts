/**
 * `npm run bench`: imports every `bench/*.bench.ts` (alphabetical) and runs its default export, an async
 * function that prints its own figures. `npm run bench -- import fit` runs only the files whose names
 * contain one of the words. Nothing is asserted: speed is measured here, never in tests.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const filters = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => filters.length === 0 || filters.some((w) => f.includes(w)))
  .sort();

if (files.length === 0) {
  console.error(`bench: no bench/*.bench.ts matches ${filters.join(' ')}`);
  process.exit(2);
}
console.log(`Node ${process.version}, ${process.platform}/${process.arch}; benches: ${files.join(', ')}\n`);
let failed = 0;
for (const file of files) {
  const mod = (await import(pathToFileURL(join(here, file)).href)) as { default?: () => Promise<void> | void };
  if (typeof mod.default !== 'function') {
    console.error(`bench: ${file} has no default export function; skipped`);
    failed++;
    continue;
  }
  const t0 = performance.now();
  try {
    await mod.default();
  } catch (err) {
    failed++;
    console.error(`bench: ${file} failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
  }
  console.log(`(${file}: ${((performance.now() - t0) / 1000).toFixed(1)} s)\n`);
}
process.exit(failed > 0 ? 1 : 0);
