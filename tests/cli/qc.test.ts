import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync, copyFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { runCli } from '../../src/cli/main';
import { EXIT } from '../../src/cli/io';
import { captureIo } from '../helpers/cli-io';

// A simulated lot (invented data, src/core/simulate via `lagbench simulate`): the PDMS mixer chip of
// sample-logs/chips/pdms-mixer.json driven by flow steps 2 → 5 → 10 → 5 → 2 µL/min. Chips 2 and 4 carry
// trapped air. Truth (simulator summary): R = 4.991 mbar/(µL/min), C = 10.33 nL/mbar = 103.3 nL/kPa and
// τ ≈ 3.09 s without air; 2 µL of air adds ≈ V/p ≈ 15 nL/kPa at ≈ 1.15 bar (physics.md §3.3), so
// C ≈ 118 nL/kPa and τ ≈ 3.5 s (τ = R·C) — beyond the spec's C ≤ 110 nL/kPa and t₉₅ ≤ 10 s.
const REPO = process.cwd();
let dir = '';
const BUBBLES: Record<string, string | null> = { 'M2-001': null, 'M2-002': '2uL', 'M2-003': null, 'M2-004': '4uL', 'M2-005': null };

async function simulate(out: string, seed: number, bubble: string | null, program = join(dir, 'steps.prog')): Promise<void> {
  const io = captureIo(dir);
  const args = ['simulate', join(REPO, 'sample-logs/chips/pdms-mixer.json'), '--program', program, '--out', out, '--seed', String(seed)];
  if (bubble) args.push('--bubble', bubble);
  expect(await runCli(args, io), io.stderrText()).toBe(0);
}

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'lagbench-qc-'));
  mkdirSync(join(dir, 'lot-A'));
  writeFileSync(join(dir, 'steps.prog'), '# invented demo program\ntime_s,flow[uL/min]\n0,2\n15,5\n45,10\n75,5\n105,2\n');
  let seed = 11;
  for (const [chip, bubble] of Object.entries(BUBBLES)) await simulate(join(dir, 'lot-A', `${chip}.csv`), seed++, bubble);
  copyFileSync(join(REPO, 'qc-specs/pdms-mixer-m2-settling.json'), join(dir, 'settling.json'));
  const full = JSON.parse(readFileSync(join(REPO, 'qc-specs/pdms-mixer-m2.json'), 'utf8')) as { test: { chip_description: string } };
  full.test.chip_description = join(REPO, 'sample-logs/chips/pdms-mixer.json');
  writeFileSync(join(dir, 'full.json'), JSON.stringify(full));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

interface Summary {
  chips: { chip_id: string; verdict: string; disposition: string; record: { id: number; status: string } | null; reports: string[]; error: string | null }[];
  workers: number;
}

describe('lagbench qc', () => {
  it('qc <lot folder> --spec pdms-mixer-m2 rejects exactly the chips with trapped air (C and t₉₅ fail, R passes)', async () => {
    const io = captureIo(dir);
    const code = await runCli(['qc', 'lot-A', '--spec', 'full.json', '--db', 'full.sqlite', '--report-dir', 'full-reports', '--json'], io);
    const summary = JSON.parse(io.stdoutText()) as Summary & { chips: { checks: { check: string; verdict: string }[]; quantities_si: { resistance: { value: number } } }[] };
    expect(summary.chips.filter((c) => c.verdict === 'fail').map((c) => c.chip_id).sort()).toEqual(['M2-002', 'M2-004']);
    expect(summary.chips.filter((c) => c.verdict === 'pass').map((c) => c.chip_id).sort()).toEqual(['M2-001', 'M2-003', 'M2-005']);
    for (const c of summary.chips) {
      // R is not changed by air: it passes everywhere and matches the simulator's 4.991 mbar/(µL/min) = 2.995e13 Pa·s/m³ within 1 %.
      expect(c.checks.find((x) => x.check === 'resistance')?.verdict).toBe('pass');
      expect(c.quantities_si.resistance.value / 2.9946e13).toBeCloseTo(1, 1);
      const air = BUBBLES[c.chip_id ?? ''];
      expect(c.checks.find((x) => x.check === 'compliance')?.verdict).toBe(air ? 'fail' : 'pass');
    }
    expect(code).toBe(EXIT.qcFailed);
    const html = readFileSync(join(dir, 'full-reports', 'M2-002.html'), 'utf8');
    expect(html).toContain('Compliance breakdown');
    expect(html).toContain('Estimated trapped-air volume');
  });

  it('qc <lot folder> --spec settling rejects exactly the chips with trapped air, exits 3, records them and writes reports', async () => {
    const io = captureIo(dir);
    const code = await runCli(['qc', 'lot-A', '--spec', 'settling.json', '--lot', 'A', '--operator', 'J. Doe', '--json'], io);
    const summary = JSON.parse(io.stdoutText()) as Summary;
    const failed = summary.chips.filter((c) => c.verdict === 'fail').map((c) => c.chip_id).sort();
    expect(failed).toEqual(Object.keys(BUBBLES).filter((k) => BUBBLES[k]).sort());
    expect(summary.chips.filter((c) => c.verdict === 'pass').map((c) => c.chip_id).sort()).toEqual(['M2-001', 'M2-003', 'M2-005']);
    expect(code).toBe(EXIT.qcFailed);
    expect(summary.chips.every((c) => c.record?.status === 'recorded')).toBe(true);
    for (const c of summary.chips) for (const r of c.reports) expect(existsSync(join(dir, r))).toBe(true);
    expect(existsSync(join(dir, 'qc-reports', 'lot-A.html'))).toBe(true);
    expect(existsSync(join(dir, 'lagbench-records.sqlite'))).toBe(true);
    // Not a TTY: one progress line per chip on stderr.
    expect(io.stderrText().match(/^qc \d\/5: /gm)).toHaveLength(5);
    const html = readFileSync(join(dir, 'qc-reports', 'M2-002.html'), 'utf8');
    expect(html).toContain('whole CI outside the limit → fail');
    expect(html).toContain('<polyline');
  });

  it('qc re-run on the same logs reports already recorded and adds no record; history finds the lot', async () => {
    const io = captureIo(dir);
    expect(await runCli(['qc', 'lot-A', '--spec', 'settling.json', '--lot', 'A', '--operator', 'J. Doe'], io)).toBe(EXIT.qcFailed);
    expect(io.stdoutText()).toMatch(/\(already\)/);
    expect(io.stderrText()).toMatch(/already recorded/);
    const h = captureIo(dir);
    expect(await runCli(['history', '--lot', 'A', '--json'], h)).toBe(0);
    const out = JSON.parse(h.stdoutText()) as { records: { chipId: string; verdict: string; inputs: { sha256: string }[] }[]; lot_statistics: { counts: Record<string, number> } };
    expect(out.records).toHaveLength(5);
    expect(out.lot_statistics.counts).toEqual({ pass: 3, fail: 2, retest: 0, inconclusive: 0 }); // chips 2 and 4 carry air (header)
    expect(out.records[0]?.inputs[0]?.sha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it('history --csv gives one row per record that papaparse reads back; --chip and --since filter', async () => {
    const io = captureIo(dir);
    expect(await runCli(['history', '--csv', '--chip', 'M2-004'], io)).toBe(0);
    const rows = Papa.parse<Record<string, unknown>>(io.stdoutText().trimEnd(), { header: true, dynamicTyping: true }).data;
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ chip_id: 'M2-004', verdict: 'fail', lot: 'A', operator: 'J. Doe' });
    expect(typeof rows[0]?.tau_s).toBe('number');
    const later = captureIo(dir);
    expect(await runCli(['history', '--since', '2999-01-01', '--json'], later)).toBe(0);
    expect((JSON.parse(later.stdoutText()) as { records: unknown[] }).records).toHaveLength(0);
    const table = captureIo(dir);
    expect(await runCli(['history', '--lot', 'A'], table)).toBe(0);
    expect(table.stdoutText()).toMatch(/Lot A: 3 pass, 2 fail/);
  });

  it('qc over the chips without air passes them all and exits 0', async () => {
    const io = captureIo(dir);
    const code = await runCli(['qc', 'lot-A/M2-001.csv', 'lot-A/M2-003.csv', '--spec', 'settling.json', '--db', 'other.sqlite', '--report-dir', 'r0'], io);
    expect(io.stdoutText()).toMatch(/2 log\(s\): 2 pass, 0 fail/);
    expect(code).toBe(EXIT.ok);
  });

  it('qc of a log without steps is inconclusive, disposition retest, exit 4', async () => {
    const program = join(dir, 'constant.csv');
    writeFileSync(program, 'time_s,flow[uL/min]\n0,5\n');
    mkdirSync(join(dir, 'flat'), { recursive: true });
    await simulate(join(dir, 'flat', 'M2-009.csv'), 3, null, program);
    const io = captureIo(dir);
    const code = await runCli(['qc', 'flat', '--spec', 'settling.json', '--db', 'flat.sqlite', '--report-dir', 'r1', '--json'], io);
    const summary = JSON.parse(io.stdoutText()) as Summary;
    expect(summary.chips[0]).toMatchObject({ chip_id: 'M2-009', verdict: 'inconclusive', disposition: 'retest' });
    expect(code).toBe(EXIT.qcInconclusive);
  });

  it('qc --chip-id-from filename:<regex> and metadata:<missing key> (located error, exit 2)', async () => {
    const ok = captureIo(dir);
    await runCli(['qc', 'lot-A/M2-001.csv', '--spec', 'settling.json', '--db', 'ids.sqlite', '--report-dir', 'r2', '--chip-id-from', 'filename:^M2-(\\d+)', '--json'], ok);
    expect((JSON.parse(ok.stdoutText()) as Summary).chips[0]?.chip_id).toBe('001'); // the regex's first capture group
    const bad = captureIo(dir);
    expect(await runCli(['qc', 'lot-A/M2-001.csv', '--spec', 'settling.json', '--db', 'ids.sqlite', '--report-dir', 'r2', '--chip-id-from', 'metadata:serial'], bad)).toBe(EXIT.badInput);
    expect(bad.stdoutText()).toMatch(/no metadata line "serial/);
  });

  it('qc with a broken spec exits 2 with file:line:column and no stack trace', async () => {
    writeFileSync(join(dir, 'broken.json'), '{\n  "lagbench_qc_spec": 1,\n  "limits": { "t95": { "unit": "hours", "max": 1 } }\n}');
    const io = captureIo(dir);
    expect(await runCli(['qc', 'lot-A', '--spec', 'broken.json'], io)).toBe(EXIT.badInput);
    expect(io.stderrText()).toMatch(/broken\.json:\d+:\d+: /);
    expect(io.stderrText()).toMatch(/Unknown unit "hours"/);
    expect(io.stderrText()).not.toMatch(/at .*\.ts:\d+/);
  });

  it('qc usage errors (no --spec, bad --jobs, unknown option) exit 2', async () => {
    for (const args of [['qc', 'lot-A'], ['qc', 'lot-A', '--spec', 'settling.json', '--jobs', '0'], ['qc', 'lot-A', '--spec', 'settling.json', '--frobnicate']]) {
      const io = captureIo(dir);
      expect(await runCli(args, io)).toBe(EXIT.badInput);
    }
    const h = captureIo(dir);
    expect(await runCli(['history', '--db', 'nope.sqlite'], h)).toBe(EXIT.badInput);
    expect(h.stderrText()).toMatch(/no QC record store/);
  });
});
