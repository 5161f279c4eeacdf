import { describe, expect, it } from 'vitest';
import { csvField, csvText, splitCsvLine } from '../../src/sheets/csv.js';

// Quoting rules from Y. Shafranovich, "Common Format and MIME Type for Comma-Separated Values
// (CSV) Files", RFC 4180 (2005), section 2.

describe('splitCsvLine', () => {
  it('keeps the delimiter inside quotes and reads "" as one quote', () => {
    expect(splitCsvLine('a,"b,c","d ""e"""')).toEqual(['a', 'b,c', 'd "e"']);
  });

  it('splits on another delimiter, leaving decimal commas in the fields', () => {
    expect(splitCsvLine('400,5;0,123;"x;y"', ';')).toEqual(['400,5', '0,123', 'x;y']);
    expect(splitCsvLine('400,5\t0,123', '\t')).toEqual(['400,5', '0,123']);
  });
});

describe('csvField and csvText', () => {
  it('quote only fields with a comma, quote or line break, and read back the same', () => {
    expect(csvField('4T1g(F)')).toBe('4T1g(F)');
    expect(csvField('3T1g(H,1)')).toBe('"3T1g(H,1)"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    const rows = [
      ['name', 'label'],
      ['a', '3T1g(H,1)'],
      ['b', 'say "hi"'],
    ];
    const text = csvText(rows);
    expect(text.endsWith('\n')).toBe(true);
    expect(
      text
        .trimEnd()
        .split('\n')
        .map((l) => splitCsvLine(l)),
    ).toEqual(rows);
  });
});
