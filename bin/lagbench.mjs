#!/usr/bin/env node
// Thin launcher: the CLI is bundled to dist/ by `npm run build` (run by npm's `prepare` on install).
import { existsSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';

const bundle = fileURLToPath(new URL('../dist/cli/lagbench.mjs', import.meta.url));
if (!existsSync(bundle)) {
  process.stderr.write("lagbench: the CLI is not built yet. Run 'npm install' (or 'npm run build') in the Lagbench folder.\n");
  process.exit(1);
}
await import(pathToFileURL(bundle).href);
