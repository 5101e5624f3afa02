/**
 * Design detection from addresses. The three designs are those of Steiger (1980), Psychological Bulletin
 * 87:245-251, and Zou (2007), Psychological Methods 12:399-413: independent groups; dependent correlations with
 * one variable in common ("overlapping"); dependent correlations with no variable in common ("non-overlapping").
 */
import { parseAddress, CellBlock } from '../../../src/sheet/a1';
import { designProblem, detectDesign } from '../../../taskpane/design';

const b = (a: string): CellBlock => parseAddress(a)![0];
const pair = (x: string, y: string): [CellBlock, CellBlock] => [b(x), b(y)];

describe('detectDesign', () => {
  test('different sheets: independent groups', () => {
    const d = detectDesign(pair('North!B2:B41', 'North!C2:C41'), pair('South!B2:B37', 'South!C2:C37'));
    expect(d.design).toBe('independent');
    expect(d.caution).toBeUndefined();
  });
  test('same sheet, rows apart: independent groups', () => {
    expect(detectDesign(pair('S!B2:B41', 'S!C2:C41'), pair('S!B50:B80', 'S!C50:C80')).design).toBe('independent');
  });
  test('rows that partly overlap: independent, with a caution', () => {
    const d = detectDesign(pair('S!B2:B41', 'S!C2:C41'), pair('S!B30:B60', 'S!C30:C60'));
    expect(d.design).toBe('independent');
    expect(d.caution).toMatch(/share some rows/);
  });
  test('same rows, one column in common: shared, and says where the common column is', () => {
    const d = detectDesign(pair('S!B2:B41', 'S!C2:C41'), pair('S!D2:D41', 'S!B2:B41'));
    expect(d.design).toBe('shared');
    expect(d.common).toEqual({ a: 0, b: 1 });
  });
  test('same rows, four different columns: separate pairs', () => {
    expect(detectDesign(pair('S!B2:B41', 'S!C2:C41'), pair('S!D2:D41', 'S!E2:E41')).design).toBe('separate');
  });
  test('the same two columns twice cannot be compared', () => {
    expect(detectDesign(pair('S!B2:B41', 'S!C2:C41'), pair('S!C2:C41', 'S!B2:B41')).design).toBeNull();
    expect(detectDesign(pair('S!B2:B41', 'S!B2:B41'), pair('S!D2:D41', 'S!E2:E41')).design).toBeNull();
  });
  test('same column letters on another sheet are different variables', () => {
    expect(detectDesign(pair('S!B2:B41', 'S!C2:C41'), pair('T!B2:B41', 'T!C2:C41')).design).toBe('independent');
  });
});

describe('designProblem (user override)', () => {
  const sameRowsFour = [pair('S!B2:B41', 'S!C2:C41'), pair('S!D2:D41', 'S!E2:E41')] as const;
  test('independent is always allowed', () => {
    expect(designProblem('independent', ...sameRowsFour)).toBeNull();
  });
  test('shared needs one common column; separate needs none', () => {
    expect(designProblem('shared', ...sameRowsFour)).toMatch(/one column in both/);
    expect(designProblem('separate', ...sameRowsFour)).toBeNull();
    expect(designProblem('separate', pair('S!B2:B41', 'S!C2:C41'), pair('S!B2:B41', 'S!D2:D41'))).toMatch(/four different/);
  });
  test('same-rows designs refuse different rows', () => {
    expect(designProblem('separate', pair('S!B2:B41', 'S!C2:C41'), pair('S!D3:D42', 'S!E3:E42'))).toMatch(/same rows/);
  });
});
