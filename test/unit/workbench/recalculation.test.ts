/**
 * The workbench's recalculation, range cutting and formula reading, where the work could explode: an edit costs
 * work in proportion to the formulas that read it (counted, not timed), formulas run after what they read (a
 * dependency order: Kahn 1962), loops are found before anything runs (strongly connected components: Tarjan 1972)
 * and show #CIRC!, ranges reaching past the used cells are cut before any array is built, clearing a whole-sheet
 * selection visits only the cells that hold something, and a formula nested past Excel's 64 levels (Microsoft,
 * "Excel specifications and limits": nested levels of functions, 64) is refused with a message.
 * The expected values are worked out by hand in each test from the cells it writes.
 */
import { Area } from '../../../workbench/a1';
import { Calculator } from '../../../workbench/calculator';
import { CellValue, errorValue, isErrorValue } from '../../../workbench/cell-values';
import { clipToUsed, FormulaResult } from '../../../workbench/formula-evaluator';
import { FormulaNode, FormulaSyntaxError, MAX_NESTING, parseFormula } from '../../../workbench/formula-parser';
import { WorkbookEditor } from '../../../workbench/workbook-editor';
import { WorkbookModel } from '../../../workbench/workbook-model';

/** A stand-in for the function host: =F(ref) answers 1 + the first cell of ref (an error passes through). */
function plusOne(model: WorkbookModel) {
  const calls: string[] = [];
  return {
    calls,
    evaluate: async (node: FormulaNode, site: { sheet: string; row: number; column: number }): Promise<FormulaResult> => {
      calls.push(`${site.row}:${site.column}`);
      if (node.kind !== 'call') return [[errorValue('#VALUE!')]];
      const arg = node.args[0];
      if (!arg || arg.kind !== 'ref') return [[1]];
      const v: CellValue = model.value(arg.area.sheet, arg.area.top, arg.area.left);
      if (isErrorValue(v)) return [[v]];
      return [[(typeof v === 'number' ? v : 0) + 1]];
    },
  };
}

function setup() {
  const model = new WorkbookModel();
  model.addSheet('S');
  for (let r = 2; r <= 49; r++) model.setEntry('S', r, 2, r);
  const evaluator = plusOne(model);
  const calculator = new Calculator(model, evaluator);
  const editor = new WorkbookEditor(model, calculator);
  return { model, evaluator, calculator, editor };
}

describe('an edit costs work in proportion to the formulas that read it', () => {
  test.each([300, 600])('%i formulas reading B2:B49: one edit in B5 evaluates each once', async (count) => {
    const { model, calculator, editor } = setup();
    for (let i = 0; i < count; i++) model.setEntry('S', 2 + i, 5, '=F($B$2:$B$49)');
    await editor.recalcAll();
    const before = calculator.evaluations;
    const queries = jest.spyOn(model, 'formulasReading');
    await editor.write('S', 5, 2, [[99]]);
    expect(calculator.evaluations - before).toBe(count);
    // One query for the edit, one per formula planned and at most one per changed result: linear, not quadratic.
    expect(queries.mock.calls.length).toBeLessThanOrEqual(2 * count + 2);
    expect(model.value('S', 2, 5)).toBe(3); // B2 holds 2: 2 + 1
  });

  test('an edit far from every formula evaluates none', async () => {
    const { model, calculator, editor } = setup();
    for (let i = 0; i < 50; i++) model.setEntry('S', 2 + i, 5, '=F($B$2:$B$49)');
    await editor.recalcAll();
    const before = calculator.evaluations;
    await editor.write('S', 400, 20, [[1]]);
    expect(calculator.evaluations - before).toBe(0);
  });

  test('a chain runs in dependency order, each link once, whatever order it was typed in', async () => {
    const { model, calculator, editor } = setup();
    // G5 reads G4 reads G3 reads G2 reads B2; typed bottom-up so entry order is the reverse of the needed order.
    model.setEntry('S', 5, 7, '=F(G4)');
    model.setEntry('S', 4, 7, '=F(G3)');
    model.setEntry('S', 3, 7, '=F(G2)');
    model.setEntry('S', 2, 7, '=F(B2)');
    await editor.recalcAll();
    const before = calculator.evaluations;
    await editor.write('S', 2, 2, [[10]]);
    expect(calculator.evaluations - before).toBe(4);
    expect([2, 3, 4, 5].map((r) => model.value('S', r, 7))).toEqual([11, 12, 13, 14]);
  });
});

describe('circular references stop at once with #CIRC!', () => {
  test('a formula reading its own cell is not evaluated and says so', async () => {
    const { model, evaluator, editor } = setup();
    const f = model.setEntry('S', 49, 2, '=F(B2:B49)');
    await editor.write('S', 60, 1, [[1]]);
    await (editor as unknown as { calculator: Calculator }).calculator.recalc([], f ? [f] : []);
    const v = model.value('S', 49, 2);
    expect(v).toEqual({ error: '#CIRC!', message: 'circular reference: this formula reads its own cell (B49); point it at cells outside it' });
    expect(evaluator.calls).not.toContain('49:2');
  });

  test('two formulas reading each other both show #CIRC!; a formula reading the loop shows its error', async () => {
    const { model, evaluator, editor } = setup();
    model.setEntry('S', 2, 8, '=F(I2)');
    model.setEntry('S', 2, 9, '=F(H2)');
    model.setEntry('S', 2, 10, '=F(H2)');
    await editor.recalcAll();
    for (const c of [8, 9]) {
      expect(model.value('S', 2, c)).toEqual({
        error: '#CIRC!',
        message: 'circular reference: this formula and the other one read each other (S!H2, S!I2); point one of them at other cells',
      });
    }
    expect(model.value('S', 2, 10)).toMatchObject({ error: '#CIRC!' });
    expect(evaluator.calls.filter((c) => c === '2:8' || c === '2:9')).toEqual([]);
    // Breaking the loop lets both calculate: I2 = B2 + 1 = 3, H2 = I2 + 1 = 4, J2 = H2 + 1 = 5.
    await editor.write('S', 2, 9, [['=F(B2)']]);
    expect([8, 9, 10].map((c) => model.value('S', 2, c))).toEqual([4, 3, 5]);
  });
});

describe('ranges past the used cells are cut before any array is built', () => {
  const used = () => ({ rows: 49, columns: 3 });
  const area = (top: number, left: number, bottom: number, right: number): Area => ({ sheet: 'S', top, left, bottom, right });

  test('a whole-sheet range becomes the used block', () => {
    expect(clipToUsed([area(1, 1, 1048576, 16384)], used)).toEqual([area(1, 1, 49, 3)]);
  });

  test('ranges of the same nominal height stay the same height as each other', () => {
    // B1:B100 reaches 49 used rows; C51:C150 starts past them: both keep 49 rows so the pairs still line up.
    expect(clipToUsed([area(1, 2, 100, 2), area(51, 3, 150, 3)], used)).toEqual([area(1, 2, 49, 2), area(51, 3, 99, 3)]);
  });

  test('ranges of different heights are cut on their own, and a range inside the used block is untouched', () => {
    expect(clipToUsed([area(2, 2, 30, 2), area(2, 3, 1000, 3)], used)).toEqual([area(2, 2, 30, 2), area(2, 3, 49, 3)]);
  });

  test('whole columns (bottom Infinity) are cut like the last row of the sheet', () => {
    expect(clipToUsed([area(1, 1, Infinity, 16384)], used)).toEqual([area(1, 1, 49, 3)]);
  });
});

describe('clearing a huge selection', () => {
  test('A1:Z1048576 clears what is there, and the used extent shrinks with it', async () => {
    const { model, editor } = setup();
    model.setEntry('S', 3, 30, 'kept'); // AD3 lies outside A:Z
    expect(model.usedExtent('S')).toEqual({ rows: 49, columns: 30 });
    await editor.clear({ sheet: 'S', top: 1, left: 1, bottom: 1048576, right: 26 });
    expect(model.value('S', 2, 2)).toBeNull();
    expect(model.value('S', 3, 30)).toBe('kept');
    expect(model.usedExtent('S')).toEqual({ rows: 3, columns: 30 });
  });
});

describe('deeply nested formulas', () => {
  const nested = (depth: number) => '=' + 'F('.repeat(depth) + ')'.repeat(depth);

  test(`${MAX_NESTING} levels read; one more is refused with a plain message`, () => {
    expect(parseFormula(nested(MAX_NESTING), 'S').kind).toBe('call');
    expect(() => parseFormula(nested(MAX_NESTING + 1), 'S')).toThrow(FormulaSyntaxError);
    expect(() => parseFormula(nested(MAX_NESTING + 1), 'S')).toThrow('functions are nested more than 64 deep');
  });

  test('10,000 levels are refused the same way, not with a stack overflow', () => {
    let message = '';
    try {
      parseFormula(nested(10000), 'S');
    } catch (e) {
      message = (e as Error).message;
    }
    expect(message).toBe('functions are nested more than 64 deep (the most a spreadsheet formula allows); split the formula into cells');
  });
});

describe('undo and redo', () => {
  test('typing, Delete and a block write are undone in order and redone, formulas following each step', async () => {
    const { model, editor } = setup();
    model.setEntry('S', 2, 5, '=F(B5)');
    await editor.recalcAll();
    expect(model.value('S', 2, 5)).toBe(6); // B5 holds 5
    await editor.write('S', 5, 2, [[99]]);
    expect(model.value('S', 2, 5)).toBe(100);
    await editor.write('S', 1, 7, [["'42", 'TRUE'], ['=F(B5)', null]]);
    await editor.clear({ sheet: 'S', top: 1, bottom: 1048576, left: 2, right: 2 });
    expect(model.value('S', 5, 2)).toBeNull();
    expect(model.value('S', 2, 5)).toBe(1); // F of an empty cell
    // Undo the Delete: column B comes back, and the formula with it.
    await editor.undo();
    expect(model.value('S', 5, 2)).toBe(99);
    expect(model.value('S', 49, 2)).toBe(49);
    expect(model.value('S', 2, 5)).toBe(100);
    // Undo the block: text stays text, and the cells it filled are empty again.
    expect(model.value('S', 1, 7)).toBe('42');
    await editor.undo();
    expect(model.value('S', 1, 7)).toBeNull();
    expect(model.value('S', 2, 7)).toBeNull();
    // Undo the typing: B5 is 5 again.
    await editor.undo();
    expect(model.value('S', 5, 2)).toBe(5);
    expect(model.value('S', 2, 5)).toBe(6);
    await expect(editor.undo()).resolves.toBe(false);
    // Redo the typing and the block.
    await editor.redo();
    expect(model.value('S', 5, 2)).toBe(99);
    await editor.redo();
    expect(model.value('S', 1, 7)).toBe('42');
    expect(model.value('S', 1, 8)).toBe(true);
    expect(model.value('S', 2, 7)).toBe(100);
    // A new change after undoing clears what could be redone.
    await editor.undo();
    await editor.write('S', 3, 2, [[7]]);
    await expect(editor.redo()).resolves.toBe(false);
  });
});
