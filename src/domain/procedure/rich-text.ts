/**
 * The small markup of step text: `**bold**`, `*italic*`, `` `code` ``, lines starting with
 * `- ` as bullet lists, a blank line between paragraphs. Parsed to a token tree (so islands
 * can render it without HTML strings) or rendered to HTML in which every character of the
 * source is escaped: nothing the author types can become markup.
 */

export type Inline =
  | { kind: 'text'; text: string }
  | { kind: 'code'; text: string }
  | { kind: 'bold'; children: Inline[] }
  | { kind: 'italic'; children: Inline[] }
  | { kind: 'break' };

export type Block = { kind: 'paragraph'; children: Inline[] } | { kind: 'list'; items: Inline[][] };

const BULLET = /^\s*- (.*)$/;

/** Index of the closing marker, skipping code spans (and `**` pairs when looking for `*`). */
function findClose(s: string, from: number, marker: '*' | '**'): number {
  for (let k = from; k < s.length; k++) {
    if (s[k] === '`') {
      const end = s.indexOf('`', k + 1);
      if (end > k) k = end;
      continue;
    }
    if (marker === '*' && s.startsWith('**', k)) {
      k++;
      continue;
    }
    if (s.startsWith(marker, k)) {
      // In a run like `***`, the bold closes on the last two stars so an italic inside can close first.
      if (marker === '**') while (s[k + 2] === '*') k++;
      return k;
    }
  }
  return -1;
}

/** Emphasis needs content that neither starts nor ends with a space, so "2 * 3 * 4" stays text. */
const tight = (inner: string) => inner.length > 0 && inner.trim() === inner;

function parseInline(s: string, inBold = false): Inline[] {
  const out: Inline[] = [];
  let text = '';
  const flush = () => {
    if (text) out.push({ kind: 'text', text });
    text = '';
  };
  let i = 0;
  while (i < s.length) {
    const ch = s[i];
    if (ch === '`') {
      const end = s.indexOf('`', i + 1);
      if (end > i + 1) {
        flush();
        out.push({ kind: 'code', text: s.slice(i + 1, end) });
        i = end + 1;
        continue;
      }
    } else if (!inBold && s.startsWith('**', i)) {
      const end = findClose(s, i + 2, '**');
      if (end >= 0 && tight(s.slice(i + 2, end))) {
        flush();
        out.push({ kind: 'bold', children: parseInline(s.slice(i + 2, end), true) });
        i = end + 2;
        continue;
      }
    } else if (ch === '*' && s[i + 1] !== '*') {
      const end = findClose(s, i + 1, '*');
      if (end >= 0 && tight(s.slice(i + 1, end))) {
        flush();
        out.push({ kind: 'italic', children: parseInline(s.slice(i + 1, end), inBold) });
        i = end + 1;
        continue;
      }
    }
    text += ch;
    i++;
  }
  flush();
  return out;
}

/** Parses step text into paragraphs and bullet lists of inline tokens. */
export function parseRichText(src: string): Block[] {
  const blocks: Block[] = [];
  let current: Block | null = null;
  for (const raw of src.replace(/\r\n?/g, '\n').split('\n')) {
    const line = raw.trimEnd();
    if (line.trim() === '') {
      current = null;
      continue;
    }
    const bullet = BULLET.exec(line);
    if (bullet) {
      if (current?.kind !== 'list') {
        current = { kind: 'list', items: [] };
        blocks.push(current);
      }
      current.items.push(parseInline((bullet[1] ?? '').trim()));
      continue;
    }
    if (current?.kind !== 'paragraph') {
      current = { kind: 'paragraph', children: [] };
      blocks.push(current);
    } else {
      current.children.push({ kind: 'break' });
    }
    current.children.push(...parseInline(line.trim()));
  }
  return blocks;
}

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Escapes text for HTML element content and attribute values. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ESCAPES[c] ?? c);
}

function inlineHtml(nodes: Inline[]): string {
  return nodes
    .map((n) => {
      switch (n.kind) {
        case 'text':
          return escapeHtml(n.text);
        case 'code':
          return `<code>${escapeHtml(n.text)}</code>`;
        case 'bold':
          return `<strong>${inlineHtml(n.children)}</strong>`;
        case 'italic':
          return `<em>${inlineHtml(n.children)}</em>`;
        case 'break':
          return '<br>';
      }
    })
    .join('');
}

/** Renders step text to HTML; all source text is escaped, only our own tags are emitted. */
export function renderRichTextHtml(src: string): string {
  return parseRichText(src)
    .map((b) => (b.kind === 'paragraph' ? `<p>${inlineHtml(b.children)}</p>` : `<ul>${b.items.map((it) => `<li>${inlineHtml(it)}</li>`).join('')}</ul>`))
    .join('\n');
}
