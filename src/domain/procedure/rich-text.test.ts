import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { escapeHtml, parseRichText, renderRichTextHtml } from './rich-text';

describe('parseRichText', () => {
  it.each([
    ['', []],
    ['   \n\n', []],
    ['plain', [{ kind: 'paragraph', children: [{ kind: 'text', text: 'plain' }] }]],
    [
      'a **b** c',
      [{ kind: 'paragraph', children: [{ kind: 'text', text: 'a ' }, { kind: 'bold', children: [{ kind: 'text', text: 'b' }] }, { kind: 'text', text: ' c' }] }],
    ],
    ['*i*', [{ kind: 'paragraph', children: [{ kind: 'italic', children: [{ kind: 'text', text: 'i' }] }] }]],
    ['`**x**`', [{ kind: 'paragraph', children: [{ kind: 'code', text: '**x**' }] }]],
    [
      '**bold *and italic***',
      [
        {
          kind: 'paragraph',
          children: [{ kind: 'bold', children: [{ kind: 'text', text: 'bold ' }, { kind: 'italic', children: [{ kind: 'text', text: 'and italic' }] }] }],
        },
      ],
    ],
    ['2 * 3 * 4', [{ kind: 'paragraph', children: [{ kind: 'text', text: '2 * 3 * 4' }] }]],
    ['**open', [{ kind: 'paragraph', children: [{ kind: 'text', text: '**open' }] }]],
    ['line one\nline two', [{ kind: 'paragraph', children: [{ kind: 'text', text: 'line one' }, { kind: 'break' }, { kind: 'text', text: 'line two' }] }]],
    [
      'one\n\ntwo',
      [
        { kind: 'paragraph', children: [{ kind: 'text', text: 'one' }] },
        { kind: 'paragraph', children: [{ kind: 'text', text: 'two' }] },
      ],
    ],
    [
      'Check:\n- bore\n- *journal*\nafter',
      [
        { kind: 'paragraph', children: [{ kind: 'text', text: 'Check:' }] },
        { kind: 'list', items: [[{ kind: 'text', text: 'bore' }], [{ kind: 'italic', children: [{ kind: 'text', text: 'journal' }] }]] },
        { kind: 'paragraph', children: [{ kind: 'text', text: 'after' }] },
      ],
    ],
    ['-not a bullet', [{ kind: 'paragraph', children: [{ kind: 'text', text: '-not a bullet' }] }]],
    ['- a\r\n\r\n- b', [{ kind: 'list', items: [[{ kind: 'text', text: 'a' }]] }, { kind: 'list', items: [[{ kind: 'text', text: 'b' }]] }]],
  ])('%j', (src, expected) => {
    expect(parseRichText(src)).toEqual(expected);
  });
});

describe('renderRichTextHtml', () => {
  it.each([
    ['Torque **in three passes**, see `pass 2`.', '<p>Torque <strong>in three passes</strong>, see <code>pass 2</code>.</p>'],
    ['- one\n- *two*', '<ul><li>one</li><li><em>two</em></li></ul>'],
    ['a\nb\n\nc', '<p>a<br>b</p>\n<p>c</p>'],
    ['Fuel at 5 > 3 & rising', '<p>Fuel at 5 &gt; 3 &amp; rising</p>'],
  ])('%j', (src, html) => {
    expect(renderRichTextHtml(src)).toBe(html);
  });

  // Injection attempts: each must come out as visible text, never as a tag or attribute.
  it.each([
    ['<script>alert(1)</script>', '<p>&lt;script&gt;alert(1)&lt;/script&gt;</p>'],
    ['**<img src=x onerror=alert(1)>**', '<p><strong>&lt;img src=x onerror=alert(1)&gt;</strong></p>'],
    ['`</code><script>x</script>`', '<p><code>&lt;/code&gt;&lt;script&gt;x&lt;/script&gt;</code></p>'],
    ['- "><svg onload=alert(1)>', '<ul><li>&quot;&gt;&lt;svg onload=alert(1)&gt;</li></ul>'],
    ["*' onmouseover='x*", '<p><em>&#39; onmouseover=&#39;x</em></p>'],
    ['&lt;already escaped&gt;', '<p>&amp;lt;already escaped&amp;gt;</p>'],
  ])('keeps %j as text', (src, html) => {
    expect(renderRichTextHtml(src)).toBe(html);
  });

  const ourTags = /<\/?(p|ul|li|strong|em|code)>|<br>/g;
  test.prop([fc.string({ maxLength: 200 })])('emits no markup but its own tags, and no raw quote or ampersand', (src) => {
    const stripped = renderRichTextHtml(src).replace(ourTags, '');
    expect(stripped).not.toMatch(/[<>"']/);
    expect(stripped).not.toMatch(/&(?!(amp|lt|gt|quot|#39);)/);
  });
  test.prop([fc.string({ maxLength: 200 }).filter((s) => !/[*`\n\r]/.test(s) && !/^\s*- /.test(s) && s.trim() !== '')])('leaves unmarked text unchanged apart from escaping', (src) => {
    expect(renderRichTextHtml(src)).toBe(`<p>${escapeHtml(src.trim())}</p>`);
  });
});
