import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { runCli } from '../../src/cli/main';
import { VERSION } from '../../src/cli/version';
import { captureIo } from '../helpers/cli-io';

// Exit code 2 for a usage error is the project's convention (team brief); the version comes from package.json.
describe('runCli', () => {
  it('runCli(--version) prints the package.json version', async () => {
    const io = captureIo();
    expect(await runCli(['--version'], io)).toBe(0);
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { version: string };
    expect(io.out.join('')).toBe(`${pkg.version}\n`);
    expect(VERSION).toBe(pkg.version);
  });

  it('runCli(unknown command) exits 2 without a stack trace', async () => {
    const io = captureIo();
    expect(await runCli(['frobnicate'], io)).toBe(2);
    expect(io.err.join('')).toMatch(/unknown command 'frobnicate'/);
    expect(io.err.join('')).not.toMatch(/at .*\.ts:\d+/);
  });
});
