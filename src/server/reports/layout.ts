/** Pure layout helpers for the PDFs: text wrapping, column widths, glyph fallbacks. */

/** Splits text into lines no wider than `maxWidth` (by the given measure); long words break by character. */
export function wrapText(text: string, maxWidth: number, widthOf: (s: string) => number): string[] {
  const out: string[] = [];
  for (const para of text.split('\n')) {
    const words = para.split(/\s+/).filter(Boolean);
    if (words.length === 0) {
      out.push('');
      continue;
    }
    let line = '';
    for (let word of words) {
      while (widthOf(word) > maxWidth && word.length > 1) {
        // A word wider than the column (a hash, a long id): break it where it no longer fits.
        let cut = word.length - 1;
        while (cut > 1 && widthOf(word.slice(0, cut)) > maxWidth) cut--;
        if (line) {
          out.push(line);
          line = '';
        }
        out.push(word.slice(0, cut));
        word = word.slice(cut);
      }
      const candidate = line ? `${line} ${word}` : word;
      if (widthOf(candidate) <= maxWidth) line = candidate;
      else {
        out.push(line);
        line = word;
      }
    }
    out.push(line);
  }
  return out;
}

/** Column widths in points from relative weights over the available width. */
export const columnWidths = (weights: readonly number[], total: number): number[] => {
  const sum = weights.reduce((a, b) => a + b, 0);
  return weights.map((w) => (w / sum) * total);
};

const FALLBACKS: Record<string, string> = { '−': '-', '→': '->', '←': '<-', '≤': '<=', '≥': '>=', '…': '...', '✓': 'ok', '✗': 'x', '¼': '1/4', '½': '1/2', '¾': '3/4' };

/** Replaces characters the embedded font has no glyph for with plain look-alikes (or '?'). */
export function withGlyphs(text: string, has: (codePoint: number) => boolean): string {
  let out = '';
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    if (cp === 10 || has(cp)) out += ch;
    else if (FALLBACKS[ch] && [...FALLBACKS[ch]!].every((c) => has(c.codePointAt(0)!))) out += FALLBACKS[ch];
    else out += '?';
  }
  return out;
}

/** "Page 3 of 12". */
export const pageLabel = (n: number, of: number) => `Page ${n} of ${of}`;
