// Builds the CLI bundle (always) and, with --app, the desktop app (Electron main/preload + renderer).
// Runs on `npm install` through `prepare`, so `npx lagbench` works right after `npm ci`.
import { build } from 'esbuild';
import { existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';

const withApp = process.argv.includes('--app');

const nodeEntries = [
  { in: 'src/cli/entry.ts', out: 'dist/cli/lagbench.mjs' },
  ...(existsSync('src/cli/qc-worker.ts') ? [{ in: 'src/cli/qc-worker.ts', out: 'dist/cli/qc-worker.mjs' }] : []),
];
for (const e of nodeEntries) {
  await build({
    entryPoints: [e.in],
    outfile: e.out,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    sourcemap: true,
    logLevel: 'warning',
  });
}

if (withApp) {
  if (existsSync('electron/main.ts')) {
    for (const name of ['main', 'preload']) {
      await build({
        entryPoints: [`electron/${name}.ts`],
        outfile: `dist/electron/${name}.cjs`,
        bundle: true,
        platform: 'node',
        format: 'cjs',
        target: 'node20',
        external: ['electron', 'better-sqlite3'],
        sourcemap: true,
        logLevel: 'warning',
      });
    }
  }
  if (existsSync('vite.config.ts')) {
    const r = spawnSync(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });
    if (r.status !== 0) process.exit(r.status ?? 1);
  }
}
