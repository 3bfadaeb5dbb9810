import { describe, expect, it } from 'vitest';
import { FormatError } from '../../src/errors.js';
import { toDense } from '../../src/gf2/index.js';
import { type MatrixFormat, parseMatrix } from '../../src/formats/index.js';

/** The FormatError a parse throws (fails the test if it returns or throws anything else). */
function formatError(text: string, file: string, format?: MatrixFormat): FormatError {
  try {
    parseMatrix(text, file, format);
  } catch (e) {
    if (e instanceof FormatError) return e;
    throw e;
  }
  throw new Error(`parsed without error:\n${text}`);
}

function expectError(text: string, file: string, line: number, problem: RegExp, format?: MatrixFormat): void {
  const e = formatError(text, file, format);
  expect({ file: e.file, line: e.line }).toEqual({ file, line });
  expect(e.problem).toMatch(problem);
  expect(e.message).toBe(`${file}:${line}: ${e.problem}`);
}

const lines = (...ls: string[]) => `${ls.join('\n')}\n`;

describe('empty files, every format', () => {
  for (const f of ['m.mtx', 'm.alist', 'm.txt', 'm.dense', 'm.json', 'no-extension']) {
    it(f, () => {
      expectError('', f, 1, /^empty file$/);
      expectError('  \n\n\t\n', f, 1, /^empty file$/);
    });
  }
});

describe('Matrix Market', () => {
  const PAT = '%%MatrixMarket matrix coordinate pattern general';
  const INT = '%%MatrixMarket matrix coordinate integer general';

  it('reads a small file in each accepted dialect', () => {
    const want = [[1, 0, 1], [0, 1, 0]];
    expect(toDense(parseMatrix(lines(PAT, '% c', '2 3 3', '1 1', '2 2', '1 3'), 'a.mtx'))).toEqual(want);
    expect(toDense(parseMatrix(lines(INT, '2 3 4', '1 1 1', '2 1 0', '2 2 1', '1 3 1'), 'a.mtx'))).toEqual(want);
    // column-major: (1,1) (2,1) (1,2) (2,2) (1,3) (2,3)
    expect(toDense(parseMatrix(lines('%%MatrixMarket matrix array integer general', '2 3', '1', '0', '0', '1', '1', '0'), 'a.mtx'))).toEqual(want);
  });

  it('entries that are not 0/1', () => {
    expectError(lines(INT, '% c', '2 3 2', '1 1 1', '2 3 2'), 'a.mtx', 5, /value 2 is not 0 or 1/);
    expectError(lines(INT, '2 3 1', '1 1 -1'), 'a.mtx', 3, /value -1 is not 0 or 1/);
    expectError(lines(INT, '2 3 1', '1 1 1.0'), 'a.mtx', 3, /"1.0" is not an integer/);
    expectError(lines('%%MatrixMarket matrix array integer general', '2 2', '1', '0', '7', '1'), 'a.mtx', 5, /value 7 is not 0 or 1/);
  });

  it('indices out of range', () => {
    expectError(lines(PAT, '3 3 2', '1 1', '4 2'), 'a.mtx', 4, /row index 4 is out of range 1\.\.3/);
    expectError(lines(PAT, '3 3 2', '1 1', '2 9'), 'a.mtx', 4, /column index 9 is out of range 1\.\.3/);
    expectError(lines(PAT, '3 3 1', '0 1'), 'a.mtx', 3, /row index 0 is out of range/);
    expectError(lines(PAT, '3 3 1', '1 x'), 'a.mtx', 3, /column index "x" is not a whole number/);
  });

  it('duplicate entries', () => {
    expectError(lines(PAT, '3 3 3', '1 1', '2 2', '1 1'), 'a.mtx', 5, /entry \(1, 1\) given twice \(first on line 3\)/);
    expectError(lines(INT, '3 3 2', '2 3 0', '2 3 1'), 'a.mtx', 4, /entry \(2, 3\) given twice \(first on line 3\)/);
  });

  it('wrong number of values on a line (the coordinate analogue of a ragged row)', () => {
    expectError(lines(PAT, '3 3 2', '1 1', '2 2 1'), 'a.mtx', 4, /expected an entry "row column", found 3 values/);
    expectError(lines(INT, '3 3 1', '2 2'), 'a.mtx', 3, /expected an entry "row column value", found 2 values/);
    expectError(lines(PAT, '3 3'), 'a.mtx', 2, /size line must be "rows columns entries", found 2 values/);
    expectError(lines('%%MatrixMarket matrix array integer general', '1 2', '1 0'), 'a.mtx', 3, /one value per line, found 2/);
  });

  it('truncated files and extra entries', () => {
    expectError(lines(PAT, '% c', '3 3 3', '1 1', '2 2'), 'a.mtx', 5, /file ends after 2 of 3 entries \(truncated\?\)/);
    expectError(lines(PAT, '% only comments'), 'a.mtx', 2, /file ends before the size line/);
    expectError(lines('%%MatrixMarket matrix array integer general', '2 2', '1', '0', '1'), 'a.mtx', 5, /file ends after 3 of 4 values/);
    expectError(lines(PAT, '3 3 1', '1 1', '2 2'), 'a.mtx', 4, /more entries than the 1 stated on the size line \(line 2\)/);
  });

  it('unsupported types say what is supported', () => {
    for (const t of ['coordinate real general', 'coordinate complex general', 'coordinate pattern symmetric', 'coordinate integer skew-symmetric', 'array real general', 'array pattern general']) {
      expectError(lines(`%%MatrixMarket matrix ${t}`, '1 1 0'), 'a.mtx', 1, /supported: matrix coordinate pattern general, matrix coordinate integer general, matrix array integer general/);
    }
    expectError(lines('%%MatrixMarket vector coordinate pattern general', '1 1 0'), 'a.mtx', 1, /unsupported Matrix Market object/);
    expectError(lines('101', '010'), 'a.mtx', 1, /expected the Matrix Market header/);
    expectError(lines(PAT, '2 2 5'), 'a.mtx', 2, /5 entries cannot fit in a 2 x 2 matrix/);
    expectError(lines(PAT, '99999999 99999999 0'), 'a.mtx', 2, /beyond the supported limit/);
  });
});

describe('alist', () => {
  // H = [[1,1,0],[0,1,1]]: 3 columns, 2 rows.
  const good = ['3 2', '2 2', '1 2 1', '2 2', '1 0', '1 2', '2 0', '1 2', '2 3'];
  const withLine = (n: number, text: string) => lines(...good.map((l, i) => (i + 1 === n ? text : l)));

  it('reads the example, padded and unpadded', () => {
    expect(toDense(parseMatrix(lines(...good), 'h.alist'))).toEqual([[1, 1, 0], [0, 1, 1]]);
    expect(toDense(parseMatrix(withLine(5, '1').replace('\n2 0\n', '\n2\n'), 'h.alist'))).toEqual([[1, 1, 0], [0, 1, 1]]);
  });

  it('indices out of range', () => {
    expectError(withLine(6, '1 3'), 'h.alist', 6, /column 2: row index 3 is out of range 1\.\.2/);
    expectError(withLine(9, '2 4'), 'h.alist', 9, /row 2: column index 4 is out of range 1\.\.3/);
  });

  it('lists that do not match their weight, padding out of place, repeated indices', () => {
    expectError(withLine(6, '1 0'), 'h.alist', 6, /column 2 lists 1 row indices, but its weight is 2/);
    expectError(withLine(5, '0 1'), 'h.alist', 5, /row index 1 after zero padding/);
    expectError(withLine(8, '1 1'), 'h.alist', 8, /row 1: column index 1 is listed twice/);
  });

  it('column lists and row lists that disagree name the line', () => {
    expectError(withLine(9, '1 3'), 'h.alist', 9, /row 2 lists column 1, but the list of column 1 \(line 5\) does not contain row 2/);
    // row 1 leaves out column 2 and row 2 claims column 1 instead (weights adjusted so the totals agree)
    const t = lines('3 2', '2 3', '1 2 1', '1 3', '1 0', '1 2', '2 0', '1 0 0', '1 2 3');
    expectError(t, 'h.alist', 8, /row 1 does not list column 2, but the list of column 2 \(line 6\) contains row 1/);
  });

  it('header counts', () => {
    expectError(withLine(1, '3'), 'h.alist', 1, /size line must be "columns rows"/);
    expectError(withLine(3, '1 2'), 'h.alist', 3, /expected 3 column weights, found 2/);
    expectError(withLine(4, '2 1'), 'h.alist', 4, /row weights add up to 3 but column weights \(line 3\) add up to 4/);
    expectError(withLine(4, '2 x'), 'h.alist', 4, /"x" is not a whole number/);
    expectError(withLine(3, '1 3 1'), 'h.alist', 3, /column 2 has weight 3, above the maximum 2 stated on line 2/);
    expectError(withLine(2, '3 2'), 'h.alist', 2, /maximum column weight 3 exceeds the 2 rows/);
  });

  it('truncated files and trailing text', () => {
    expectError(lines(...good.slice(0, 7)), 'h.alist', 7, /file ends before the list of row 1 \(line 8; truncated\?\)/);
    expectError(lines(...good.slice(0, 2)), 'h.alist', 2, /file ends before the column weights line/);
    expectError(lines(...good, '', '1 2'), 'h.alist', 11, /unexpected text after the 2 row lists/);
  });
});

describe('dense', () => {
  it('reads comments, blank lines and spaces', () => {
    expect(toDense(parseMatrix(lines('# c', '101', '', '0 1 1   # t', '\t1\t1 0'), 'd.txt'))).toEqual([[1, 0, 1], [0, 1, 1], [1, 1, 0]]);
  });

  it('entries that are not 0/1 and stray characters', () => {
    expectError(lines('# c', '101', '', '0120'), 'd.txt', 4, /entry "2" \(character 3\) is not 0 or 1/);
    expectError(lines('101', '1x1'), 'd.dense', 2, /unexpected character "x"/);
  });

  it('ragged rows name the line and both lengths', () => {
    expectError(lines('# c', '101', '', '1 1'), 'd.txt', 4, /row has 2 entries, but the first row \(line 2\) has 3/);
    expectError(lines('101', '010', '1101'), 'd.txt', 3, /row has 4 entries, but the first row \(line 1\) has 3/);
  });

  it('a file truncated inside a row, and a file with no rows', () => {
    expectError('1010\n0101\n01', 'd.txt', 3, /row has 2 entries, but the first row \(line 1\) has 4/);
    expectError(lines('# nothing', '', '#'), 'd.txt', 1, /no matrix rows/);
  });
});

describe('JSON', () => {
  const head = '{"rows":2,"cols":3,"support":[';

  it('reads the shape', () => {
    expect(toDense(parseMatrix(lines(head, '[0,1],', '[2,1]', ']}'), 'j.json'))).toEqual([[1, 1, 0], [0, 1, 1]]);
  });

  it('indices out of range, not integers, repeated', () => {
    expectError(lines(head, '[0,1],', '[1,3]', ']}'), 'j.json', 3, /support row 1: column index 3 is out of range 0\.\.2/);
    expectError(lines(head, '[0,1],', '[-1]', ']}'), 'j.json', 3, /column index -1 is out of range/);
    expectError(lines(head, '[0,1.5],', '[1]', ']}'), 'j.json', 2, /column index must be an integer, found the number 1.5/);
    expectError(lines(head, '[0,1],', '["2"]', ']}'), 'j.json', 3, /column index must be an integer, found the string "2"/);
    expectError(lines(head, '[0,1],', '[1,1]', ']}'), 'j.json', 3, /support row 1: column index 1 is listed twice/);
  });

  it('shape problems', () => {
    expectError(lines('{"rows":3,"cols":3,"support":[', '[0,1],', '[1]', ']}'), 'j.json', 1, /"support" has 2 rows, but "rows" is 3/);
    expectError(lines('{"rows":-1,', '"cols":3,"support":[]}'), 'j.json', 1, /"rows" must be a non-negative integer, found the number -1/);
    expectError(lines('{"rows":0,', '"cols":2.5,"support":[]}'), 'j.json', 2, /"cols" must be a non-negative integer/);
    expectError(lines('{"rows":0,"cols":1,', '"support":[],', '"name":"x"}'), 'j.json', 3, /unknown key "name"/);
    expectError(lines('{"rows":0,"cols":1,', '"rows":0,"support":[]}'), 'j.json', 2, /key "rows" given twice/);
    expectError(lines('{"rows":0,', '"cols":1', '}'), 'j.json', 3, /missing key "support"/);
    expectError(lines(head, '[0,1],', '7', ']}'), 'j.json', 3, /support row 1 must be an array of column indices, found the number 7/);
    expectError(lines('[[0,1]]'), 'j.json', 1, /expected \{"rows":R,"cols":C,"support"/);
  });

  it('syntax errors and truncation give the line of the position', () => {
    expectError(lines(head, '[0,1],', '[1 2]', ']}'), 'j.json', 3, /expected "," or "]" in an array/);
    expectError(`${head}\n[0,1],\n`, 'j.json', 2, /unexpected end of file \(truncated\?\)/);
    expectError(lines(head, '[0,1],', '[1]', ']}', 'x'), 'j.json', 5, /unexpected text after the JSON value/);
    expectError('{"rows":0,"cols":1,"support":[\n], "x', 'j.json', 2, /string is not closed/);
    expectError(`${'['.repeat(200)}${']'.repeat(200)}`, 'j.json', 1, /nested deeper than 64/);
  });
});

describe('format choice', () => {
  const mtx = lines('%%MatrixMarket matrix coordinate pattern general', '1 2 1', '1 2');
  const json = '{"rows":1,"cols":2,"support":[[1]]}';
  const alist = lines('2 1', '1 1', '0 1', '1', '0', '1', '2');
  const dense = lines('# c', '01');

  it('by extension (case-insensitive), else by content', () => {
    for (const [text, ext] of [[mtx, 'MTX'], [json, 'json'], [alist, 'alist'], [dense, 'txt'], [dense, 'Dense']] as const) {
      expect(toDense(parseMatrix(text, `m.${ext}`))).toEqual([[0, 1]]);
    }
    for (const text of [mtx, json, alist, dense]) expect(toDense(parseMatrix(text, 'dir.d/m'))).toEqual([[0, 1]]);
  });

  it('the extension wins over content', () => {
    expectError(json, 'm.mtx', 1, /expected the Matrix Market header/);
    expectError(dense, 'm.json', 1, /expected a JSON value/);
  });

  it('unrecognisable content without a known extension', () => {
    expectError(lines('hello', 'world'), 'm.dat', 1, /cannot tell the file format/);
  });
});
