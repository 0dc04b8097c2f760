import { describe, expect, it } from 'vitest';
import { columnWidths, pageLabel, withGlyphs, wrapText } from './layout';

const mono = (s: string) => s.length; // one unit per character

describe('report layout', () => {
  it('wraps at word boundaries and never exceeds the width', () => {
    const lines = wrapText('clearance 0.045 mm bore 80.010 journal 79.965', 12, mono);
    expect(lines).toEqual(['clearance', '0.045 mm', 'bore 80.010', 'journal', '79.965']);
    expect(lines.every((l) => l.length <= 12)).toBe(true);
  });
  it('breaks a word longer than the column and keeps paragraphs', () => {
    expect(wrapText('ab 0123456789abcdef', 8, mono)).toEqual(['ab', '01234567', '89abcdef']);
    expect(wrapText('one\n\ntwo', 20, mono)).toEqual(['one', '', 'two']);
  });
  it('splits widths by weight', () => {
    expect(columnWidths([1, 3], 400)).toEqual([100, 300]);
  });
  it('replaces glyphs the font lacks', () => {
    const has = (cp: number) => cp < 0x2000;
    expect(withGlyphs('bore − journal → 30 % ≤ 5', has)).toBe('bore - journal -> 30 % <= 5');
    expect(withGlyphs('★', has)).toBe('?');
    expect(pageLabel(2, 9)).toBe('Page 2 of 9');
  });
});
