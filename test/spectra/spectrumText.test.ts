import { describe, expect, it } from 'vitest';
import { InputError, parseSpectrumText } from '../../src/index.js';

/** The x and y columns of a parse, as plain arrays. */
function xy(text: string, options: Parameters<typeof parseSpectrumText>[1] = {}) {
  const raw = parseSpectrumText(text, options);
  return { x: Array.from(raw.x), y: Array.from(raw.y), raw };
}

describe('parseSpectrumText delimiters and decimal signs', () => {
  const expected = { x: [400, 401.5, 403], y: [0.125, 0.25, -0.5] };

  it.each([
    [
      'comma-separated, decimal point',
      'x,y\n400,0.125\n401.5,0.25\n403,-0.5\n',
      'comma-delimited, decimal point',
    ],
    [
      'tab-separated, decimal point',
      'x\ty\n400\t0.125\n401.5\t0.25\n403\t-0.5\n',
      'tab-delimited, decimal point',
    ],
    [
      'whitespace-separated',
      '  400   0.125\n401.5 0.25\n403\t -0.5\n',
      'whitespace-delimited, decimal point',
    ],
    [
      'semicolon-separated, decimal comma',
      'x;y\n400;0,125\n401,5;0,25\n403;-0,5\n',
      'semicolon-delimited, decimal comma',
    ],
    ['tab-separated, decimal comma', '400\t0,125\n401,5\t0,25\n403\t-0,5\n', 'tab-delimited, decimal comma'],
    [
      'whitespace-separated, decimal comma',
      '400,0 0,125\n401,5 0,25\n403,0 -0,5\n',
      'whitespace-delimited, decimal comma',
    ],
    [
      'quoted CSV fields',
      '"x","y"\n"400","0.125"\n"401.5","0.25"\n"403","-0.5"\n',
      'comma-delimited, decimal point',
    ],
    [
      'Windows line ends and a byte-order mark',
      '\uFEFFx,y\r\n400,0.125\r\n401.5,0.25\r\n403,-0.5\r\n',
      'comma-delimited, decimal point',
    ],
  ])('reads %s', (_, text, format) => {
    const { x, y, raw } = xy(text);
    expect(x).toEqual(expected.x);
    expect(y).toEqual(expected.y);
    expect(raw.format).toBe(format);
  });

  it('reads exponents and a leading plus sign', () => {
    expect(xy('1e3,+2.5E-2\n1.1e3,3e-2\n').y).toEqual([0.025, 0.03]);
  });

  it('refuses numbers that mix "," and "." inside one file', () => {
    expect(() => parseSpectrumText('400;0,5\n401;0.6\n')).toThrow(/both "," and "\."/);
  });
});

describe('parseSpectrumText headers, comments and trailers', () => {
  const text = [
    '# exported by an instrument',
    'Sample: test',
    'Wavelength (nm),Abs,Baseline',
    '500,0.2,0.01',
    '% a comment inside the data',
    '',
    '501,0.3,0.02',
    '502,0.4,0.03',
    '',
    'End of data',
    'Operator: someone',
  ].join('\n');

  it('skips header, comment, blank and trailing lines and keeps the source line of each point', () => {
    const { x, y, raw } = xy(text);
    expect(x).toEqual([500, 501, 502]);
    expect(y).toEqual([0.2, 0.3, 0.4]);
    expect(Array.from(raw.lines ?? [])).toEqual([4, 7, 8]);
  });

  it('names the columns from the header and reads their units', () => {
    const { raw } = xy(text);
    expect(raw.xLabel).toBe('Wavelength (nm)');
    expect(raw.yLabel).toBe('Abs');
    expect(raw.xUnit?.unit).toBe('nm');
    expect(raw.yUnit?.unit).toBe('absorbance');
  });

  it('chooses columns by number and by (part of) their name', () => {
    expect(xy(text, { yColumn: 3 }).y).toEqual([0.01, 0.02, 0.03]);
    expect(xy(text, { yColumn: 'baseline' }).y).toEqual([0.01, 0.02, 0.03]);
    expect(xy(text, { xColumn: 'wave', yColumn: '2' }).y).toEqual([0.2, 0.3, 0.4]);
  });

  it('refuses an unknown or ambiguous column, listing the columns', () => {
    expect(() => parseSpectrumText(text, { yColumn: 'epsilon' })).toThrow(
      /no such column; columns: 1 "Wavelength/,
    );
    expect(() => parseSpectrumText('ab,ac,x\n1,2,3\n2,3,4\n', { yColumn: 'a' })).toThrow(
      /more than one column/,
    );
    expect(() => parseSpectrumText(text, { yColumn: 4 })).toThrow(/columns 1 to 3/);
    expect(() => parseSpectrumText(text, { xColumn: 2, yColumn: 2 })).toThrow(/same column/);
  });

  it('does not take a date in the header for data', () => {
    expect(xy('2024-05-01 12:00\nnm,A\n400,0.1\n410,0.2\n').x).toEqual([400, 410]);
  });
});

describe('parseSpectrumText bad input', () => {
  const bad = (text: string) => {
    try {
      parseSpectrumText(text);
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      return (e as Error).message;
    }
    throw new Error('no error');
  };

  it('refuses an empty file', () => {
    expect(bad('')).toBe('the file is empty');
    expect(bad('\n  \n')).toBe('the file is empty');
  });

  it('refuses a file without rows of numbers', () => {
    expect(bad('Wavelength,Abs\nabc,def\n')).toMatch(/^no rows of numbers found in 3 lines$/);
  });

  it('refuses a single row', () => {
    expect(bad('x,y\n400,0.1\n')).toMatch(/only 1 row/);
  });

  it('names the line and value of a NaN or empty y', () => {
    expect(bad('x,y\n400,0.1\n401,NaN\n402,0.3\n')).toBe('line 3: y value "NaN" (column 2) is not a number');
    expect(bad('x,y\n400,0.1\n401,\n402,0.3\n')).toBe('line 3: y value "" (column 2) is not a number');
  });

  it('names the line of a row with too few columns', () => {
    expect(bad('x,y\n400,0.1\n401,0.2\n402\n')).toBe('line 4: expected at least 2 columns, found 1');
  });

  it('refuses data that resume after a line that is not numbers', () => {
    expect(bad('x,y\n400,0.1\nNaN,0.2\n402,0.3\n')).toBe(
      'line 3: "NaN,0.2" is not a row of numbers, but rows of numbers follow it (line 4)',
    );
  });
});
