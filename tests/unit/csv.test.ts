/**
 * The one CSV writer and reader (src/lib/csv.ts). Expected files are written out by hand from
 * RFC 4180 (CRLF line ends; a field holding a comma, quote or line break is quoted, quotes doubled) and
 * from the OWASP "CSV Injection" guidance (cells starting with = + - @ tab or carriage return get a
 * leading apostrophe so spreadsheets show them as text).
 */
import { describe, expect, it } from 'vitest';
import { neutraliseFormula, readCsvRecords, restoreFormulaText, toCsv } from '../../src/lib/csv.ts';

describe('neutraliseFormula (OWASP CSV Injection: = + - @ tab CR)', () => {
  it.each([
    ['=HYPERLINK("http://x.invalid","click")', `'=HYPERLINK("http://x.invalid","click")`],
    ['+1+2', "'+1+2"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['\t=1', "'\t=1"],
    ['\r=1', "'\r=1"],
    ["'=1+2", "''=1+2"], // already an apostrophe: one more, so the reader gives back exactly this
    ['-0.5', '-0.5'], // a plain number is no formula
    ['+3e2', '+3e2'],
    ['Motor 12 V', 'Motor 12 V'],
    ["it's fine", "it's fine"],
    ['', ''],
  ])('%j → %j, and restoreFormulaText gives the original back', (typed, written) => {
    expect(neutraliseFormula(typed)).toBe(written);
    expect(restoreFormulaText(written)).toBe(typed);
  });

  it('the reader drops an apostrophe only before a formula character', () => {
    expect(restoreFormulaText("'hello")).toBe("'hello");
    expect(restoreFormulaText("'5")).toBe("'5");
  });
});

describe('toCsv (RFC 4180 §2)', () => {
  it('writes CRLF lines, quotes only where needed and doubles quotes', () => {
    const csv = toCsv(
      ['name', 'note', 'qty'],
      [
        ['a,b', 'say "hi"', 3],
        ['two\nlines', null, -1],
        ['=cmd', '@x', undefined],
      ],
    );
    expect(csv).toBe('name,note,qty\r\n"a,b","say ""hi""",3\r\n"two\nlines",,-1\r\n\'=cmd,\'@x,\r\n');
  });

  it('one row, and no rows at all, still end every line in CRLF', () => {
    expect(toCsv(['a'], [['x']])).toBe('a\r\nx\r\n');
    expect(toCsv(['a', 'b'], [])).toBe('a,b\r\n');
  });
});

describe('readCsvRecords: delimiter "," always, never guessed', () => {
  it('a two-line file whose cells hold semicolons and tabs reads as commas', () => {
    const records = readCsvRecords('category,priceBreaks,description\r\ndiode,1:0.5;100:0.2,tab\there\r\n');
    expect(records).toEqual([
      { line: 1, cells: ['category', 'priceBreaks', 'description'] },
      { line: 2, cells: ['diode', '1:0.5;100:0.2', 'tab\there'] },
    ]);
  });

  it('a header alone, a byte-order mark, blank lines, and a quoted field over two lines keep their file line numbers', () => {
    expect(readCsvRecords('\uFEFFa;b\n')).toEqual([{ line: 1, cells: ['a;b'] }]);
    expect(readCsvRecords('a,b\n\n"x\ny",2\nz,3\n')).toEqual([
      { line: 1, cells: ['a', 'b'] },
      { line: 3, cells: ['x\ny', '2'] },
      { line: 5, cells: ['z', '3'] },
    ]);
  });

  it('reads back what toCsv wrote', () => {
    const rows = [
      ['=1+2', 'a,b', '"q"'],
      ["'=kept", '-7', ''],
    ];
    const back = readCsvRecords(toCsv(['x', 'y', 'z'], rows))
      .slice(1)
      .map((r) => r.cells.map(restoreFormulaText));
    expect(back).toEqual(rows);
  });
});
