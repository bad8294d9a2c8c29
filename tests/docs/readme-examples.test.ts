/**
 * Every `npx lagbench …` example in README.md runs as written, in order, on the bundled files, through the
 * built CLI (bin/lagbench.mjs → dist/cli), from a scratch folder that links sample-logs/, qc-specs/ and docs/.
 * Docs that drift from the code fail here. Expected exit codes: 0, except `qc` on a lot that holds rejected
 * chips (3, documented in the README's exit-code table).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const root = resolve(__dirname, '../..');

/** Splits a shell line into words: double and single quotes, a trailing `# comment` and `> file` removed. */
function shellWords(line: string): string[] {
  const words: string[] = [];
  let cur = '';
  let quote: string | null = null;
  let inWord = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i] as string;
    if (quote) {
      if (ch === quote) quote = null;
      else cur += ch;
    } else if (ch === '"' || ch === "'") {
      quote = ch;
      inWord = true;
    } else if (ch === '#' && !inWord) {
      break;
    } else if (/\s/.test(ch)) {
      if (inWord) words.push(cur);
      cur = '';
      inWord = false;
    } else {
      cur += ch;
      inWord = true;
    }
  }
  if (inWord) words.push(cur);
  const redirect = words.indexOf('>');
  return redirect >= 0 ? words.slice(0, redirect) : words;
}

function readmeExamples(): string[] {
  const text = readFileSync(join(root, 'README.md'), 'utf8');
  const blocks = [...text.matchAll(/```sh\n([\s\S]*?)```/g)].map((m) => m[1] as string);
  return blocks.flatMap((b) => b.split('\n')).map((l) => l.trim()).filter((l) => l.startsWith('npx lagbench '));
}

describe('README examples', () => {
  let dir = '';
  beforeAll(() => {
    execFileSync(process.execPath, ['scripts/build.mjs'], { cwd: root });
    dir = mkdtempSync(join(tmpdir(), 'lagbench-readme-'));
    for (const d of ['sample-logs', 'qc-specs', 'docs']) symlinkSync(join(root, d), join(dir, d));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  const examples = readmeExamples();
  it('README.md has CLI examples for every command', () => {
    for (const c of ['inspect', 'export', 'analyze', 'predict', 'simulate', 'whatif', 'qc', 'history']) {
      expect(examples.some((e) => e.startsWith(`npx lagbench ${c} `)), c).toBe(true);
    }
  });

  it.each(examples.map((e) => [e]))('%s', (example) => {
    const args = shellWords(example).slice(2);
    expect(example).not.toMatch(/<[a-z|…]+>/);
    const r = spawnSync(process.execPath, [join(root, 'bin/lagbench.mjs'), ...args], { cwd: dir, encoding: 'utf8', timeout: 120_000 });
    const expected = args[0] === 'qc' ? [0, 3, 4] : [0];
    expect(r.stderr).not.toMatch(/internal error/);
    expect(expected, `exit ${r.status}: ${r.stderr}`).toContain(r.status);
    // Commands that write to --out may print nothing; the others must say something.
    if (!args.includes('--out')) expect(r.stdout.length).toBeGreaterThan(0);
  });
});
