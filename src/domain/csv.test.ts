import { describe, expect, it } from 'vitest';
import { csvCell, toCsv } from './csv';

describe('csvCell', () => {
  it.each([
    ['plain', 'plain'],
    ['a,b', '"a,b"'],
    ['say "hi"', '"say ""hi"""'],
    ['line 1\nline 2', '"line 1\nline 2"'],
    ['cr\r', '"cr\r"'],
    ['', ''],
    [12, '12'],
    [0, '0'],
    [null, ''],
    [undefined, ''],
    ['=SUM(A1)', "'=SUM(A1)"],
    ['-3', "'-3"],
    ['+x,y', `"'+x,y"`],
  ])('%j → %j', (v, out) => expect(csvCell(v)).toBe(out));
});

describe('toCsv', () => {
  it('joins rows with CRLF and ends with one', () => {
    expect(toCsv(['part', 'quantity'], [['Head bolt, M12', 10], ['Gasket "MLS"', 1]])).toBe('part,quantity\r\n"Head bolt, M12",10\r\n"Gasket ""MLS""",1\r\n');
  });
  it('keeps a newline inside a quoted cell', () => {
    expect(toCsv(['a'], [['x\ny']])).toBe('a\r\n"x\ny"\r\n');
  });
});
