// The installed entry point: `node bin/lagbench.mjs inspect …` after building the bundle, as a user runs it.
import { spawnSync } from 'node:child_process';
import { beforeAll, describe, expect, it } from 'vitest';

describe('bin/lagbench.mjs inspect (spawned)', () => {
  beforeAll(() => {
    const build = spawnSync(process.execPath, ['scripts/build.mjs'], { encoding: 'utf8' });
    expect(build.status, build.stderr).toBe(0);
  });

  it('node bin/lagbench.mjs inspect sample-logs/pressure-controller.csv exits 0 and prints the columns', () => {
    const r = spawnSync(process.execPath, ['bin/lagbench.mjs', 'inspect', 'sample-logs/pressure-controller.csv'], { encoding: 'utf8', env: { ...process.env, TZ: 'UTC' } });
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain('pressure → pressure_Pa');
  });

  it('node bin/lagbench.mjs inspect <missing> exits 2 with one line and no stack trace', () => {
    const r = spawnSync(process.execPath, ['bin/lagbench.mjs', 'inspect', 'missing.csv'], { encoding: 'utf8' });
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('missing.csv: The file does not exist');
  });
});
