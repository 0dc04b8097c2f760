import { describe, expect, it } from 'vitest';
import { MAX_TAG_CODE, codeWords, tagCode } from './tag-code';

describe('tagCode', () => {
  it.each([
    ['J-0007', 'Valve shim', '3', 'J-0007-VALVE-SHIM-3'],
    ['J-0007', 'Main bearing cap', 'Main 1', 'J-0007-MAIN-BEARING-CAP-MAIN-1'],
    ['J-0012', 'Rod cap (big end)', 'Cyl. 4 / B', 'J-0012-ROD-CAP-BIG-END-CYL-4-B'],
    ['J-0001', 'Rocker arm – intake', 'Ex 2', 'J-0001-ROCKER-ARM-INTAKE-EX-2'],
    ['J-0001', 'Pièce usée', '1', 'J-0001-PIECE-USEE-1'],
    ['J-0001', '***', '', 'J-0001-PART-X'],
  ])('%s + %s + %s → %s', (job, part, pos, code) => expect(tagCode(job, part, pos)).toBe(code));

  it('adds a counter when the code is taken', () => {
    expect(tagCode('J-0007', 'Valve shim', '3', new Set(['J-0007-VALVE-SHIM-3']))).toBe('J-0007-VALVE-SHIM-3-R2');
    expect(tagCode('J-0007', 'Valve shim', '3', new Set(['J-0007-VALVE-SHIM-3', 'J-0007-VALVE-SHIM-3-R2']))).toBe('J-0007-VALVE-SHIM-3-R3');
  });

  it('stays within the column length for long names', () => {
    const c = tagCode('J-0007', 'A very long part name that goes on and on and on', 'Position with many words here');
    expect(c.length).toBeLessThanOrEqual(MAX_TAG_CODE);
    expect(c).toMatch(/^J-0007-A-VERY-LONG/);
    expect(c).not.toMatch(/--|-$/);
  });

  it.each([['  a  b ', 'A-B'], ['--x--', 'X'], ['ß', 'SS']])('codeWords(%j) → %s', (t, w) => expect(codeWords(t)).toBe(w));
});
