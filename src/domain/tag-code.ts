/**
 * A tag's readable code, written on the label and read aloud at the bench:
 * job code, part and position in capitals, e.g. "J-0007-VALVE-SHIM-3".
 */

/** Upper-case words joined by hyphens; anything but letters and digits separates words. */
export function codeWords(text: string): string {
  return text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toUpperCase()
    .replace(/[^A-Z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
}

export const MAX_TAG_CODE = 60;

/**
 * The code for a part at a position on a job. When the code is already taken in the shop
 * (the same part and position tagged again on another run), a counter is added: "-R2", "-R3" …
 */
export function tagCode(jobCode: string, partName: string, position: string, taken: ReadonlySet<string> = new Set()): string {
  const part = codeWords(partName).slice(0, 28).replace(/-+$/, '') || 'PART';
  const pos = codeWords(position).slice(0, 14).replace(/-+$/, '') || 'X';
  const base = `${codeWords(jobCode) || 'JOB'}-${part}-${pos}`.slice(0, MAX_TAG_CODE - 4);
  if (!taken.has(base)) return base;
  for (let n = 2; ; n++) {
    const c = `${base}-R${n}`;
    if (!taken.has(c)) return c;
  }
}
