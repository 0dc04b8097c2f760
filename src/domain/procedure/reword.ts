/** Teardown wording turned round for assembly, for the steps the assembly derivation copies. */

/** First words of teardown titles and their assembly counterparts (longest match first). */
const OPPOSITES: ReadonlyArray<readonly [string, string]> = [
  ['take off', 'fit'],
  ['lift off', 'lower on'],
  ['lift out', 'lower in'],
  ['uninstall', 'install'],
  ['remove', 'install'],
  ['loosen', 'tighten'],
  ['disconnect', 'connect'],
  ['detach', 'attach'],
  ['unbolt', 'bolt up'],
  ['unclip', 'clip on'],
  ['unplug', 'plug in'],
  ['drain', 'refill'],
  ['disassemble', 'assemble'],
  ['release', 'secure'],
];

function matchCase(word: string, like: string): string {
  return like[0] && like[0] === like[0].toUpperCase() ? word.charAt(0).toUpperCase() + word.slice(1) : word;
}

/** "Remove rocker shaft" → "Install rocker shaft"; titles with no known first word come back unchanged. */
export function rewordForAssembly(title: string): string {
  const lower = title.toLowerCase();
  for (const [from, to] of OPPOSITES) {
    if (lower === from || lower.startsWith(`${from} `)) return matchCase(to, title) + title.slice(from.length);
  }
  return title;
}

/** Cuts text to a schema's length limit, marking the cut with an ellipsis. */
export function fit(text: string, max: number): string {
  const t = text.trim();
  return t.length <= max ? t : `${t.slice(0, max - 1).trimEnd()}…`;
}
