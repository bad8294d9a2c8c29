import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { SETUP_SCHEMATICS } from '../../../src/core/circuits';

describe('SETUP_SCHEMATICS', () => {
  const doc = readFileSync(join(process.cwd(), 'docs', 'setups.md'), 'utf8');

  it.each(Object.entries(SETUP_SCHEMATICS))('SETUP_SCHEMATICS[%s] is drawn identically in docs/setups.md', (_, s) => {
    expect(doc).toContain(`\`\`\`\n${s.drawing}\n\`\`\``);
  });

  it('SETUP_SCHEMATICS cite their physics.md section in the formulas', () => {
    for (const s of Object.values(SETUP_SCHEMATICS)) expect(s.formulas.join(' ')).toMatch(/physics\.md §\d\.\d/);
  });
});
