/**
 * Reading ordered categories, and the rule that suggests the ordinal coefficients. The expected values are
 * worked out by hand from the definitions in src/stats/ordinal/categories.ts [custom].
 */
import { distinctCount, looksOrdinal, MAX_CATEGORIES, readCategories } from '../../../../src/stats/ordinal/categories';
import { StatsInputError } from '../../../../src/stats/types';

describe('readCategories', () => {
  test('categories are the distinct values ascending; codes and counts follow them', () => {
    const c = readCategories([5, -1, 2.5, 5, 5, -1], 'polychoric', 'x');
    expect(c.values).toEqual([-1, 2.5, 5]);
    expect(Array.from(c.codes)).toEqual([2, 0, 1, 2, 2, 0]);
    expect(c.counts).toEqual([2, 1, 3]);
  });
  test('0 and -0 are one category', () => {
    expect(readCategories([0, -0, 1], 'polychoric', 'x').counts).toEqual([2, 1]);
  });
  test('ten categories are allowed, eleven are not (the message counts them all)', () => {
    const ten = Array.from({ length: 50 }, (_, i) => i % 10);
    expect(readCategories(ten, 'polychoric', 'x').values).toHaveLength(MAX_CATEGORIES);
    const fourteen = Array.from({ length: 50 }, (_, i) => i % 14);
    expect(() => readCategories(fourteen, 'polychoric', 'x')).toThrow(
      new StatsInputError('bad-option', 'polychoric needs ordered categories: x has 14 distinct values, at most 10 are allowed'),
    );
  });
  test('a non-number is named with its row, also when it comes after an eleventh category', () => {
    expect(() => readCategories([1, 2, NaN], 'polyserial', 'y')).toThrow(
      new StatsInputError('bad-option', 'polyserial needs a number in every row: y has NaN in row 3'),
    );
    const many = [...Array.from({ length: 12 }, (_, i) => i), Infinity];
    expect(() => readCategories(many, 'polychoric', 'x')).toThrow(
      new StatsInputError('bad-option', 'polychoric needs a number in every row: x has Infinity in row 13'),
    );
  });
  test('one value only, or no rows', () => {
    expect(() => readCategories([2, 2, 2], 'polychoric', 'y')).toThrow(
      new StatsInputError('constant', 'polychoric needs at least 2 categories: every value of y is 2'),
    );
    expect(() => readCategories([], 'polychoric', 'y')).toThrow(expect.objectContaining({ code: 'too-few' }));
  });
});

describe('looksOrdinal: whole numbers with 2 to 10 distinct values', () => {
  test.each([
    [[1, 2, 2, 5, 4, 3], true],
    [[0, 1, 1, 0], true],
    [[-3, -2, -1, 0, 1, 2, 3], true],
    [Array.from({ length: 100 }, (_, i) => (i % 10) + 1), true],
    [Array.from({ length: 100 }, (_, i) => (i % 11) + 1), false],
    [[1.5, 2, 3], false],
    [[4, 4, 4], false],
    [[1, 2, NaN], false],
    [[], false],
  ])('%j -> %s', (column, expected) => {
    expect(looksOrdinal(column)).toBe(expected);
  });
});

describe('distinctCount', () => {
  test('counts up to the limit (11 by default)', () => {
    expect(distinctCount([3, 1, 3, 2])).toBe(3);
    expect(distinctCount(Float64Array.from({ length: 1000 }, (_, i) => i))).toBe(11);
    expect(distinctCount(Float64Array.from({ length: 1000 }, (_, i) => i), 1000)).toBe(1000);
    expect(distinctCount([NaN, NaN, 1])).toBe(2);
  });
});
