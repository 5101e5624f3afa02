/**
 * A small parser for the formulas the workbench evaluates: function calls such as
 * `=COVARY.COEF(B2:B49, 'Other sheet'!C2:C49, "spearman")`, with ranges, whole columns, numbers, text in double
 * quotes, TRUE/FALSE, omitted arguments (`=F(A1:A9, , 0.9)`), array constants (`{1,2;3,4}`), nested calls, and
 * table columns by structured reference (`Branches[Visits]`, `Branches[[Floor area m²]]`,
 * `Branches[[#Data],[Visits]]`), which follow the table as it grows.
 * Operators (+, *, &) are not part of it: the workbench evaluates the add-in's functions, not a spreadsheet's.
 */
import { Area, parseArea } from './a1';
import { Scalar } from './cell-values';

export type FormulaNode =
  | { kind: 'literal'; value: Scalar }
  | { kind: 'omitted' }
  | { kind: 'ref'; text: string; area: Area }
  | { kind: 'tableref'; text: string; table: string; column: string; part: TablePart }
  | { kind: 'array'; rows: Scalar[][] }
  | { kind: 'call'; name: string; args: FormulaNode[] };

/** Which rows of a table column a structured reference means: the data (default), the header, or both. */
export type TablePart = 'data' | 'headers' | 'all';

/** Functions may nest 64 deep in a formula, as in Excel; deeper text is refused before it can exhaust the stack. */
export const MAX_NESTING = 64;

export class FormulaSyntaxError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FormulaSyntaxError';
  }
}

/**
 * Parses a formula (with its leading "="). Ranges without a sheet belong to `homeSheet`.
 * @throws FormulaSyntaxError with a message a spreadsheet user understands.
 * @example parseFormula('=COVARY.COEF(B2:B9, C2:C9)', 'North') // → { kind: 'call', name: 'COVARY.COEF', args: [ref, ref] }
 */
export function parseFormula(formula: string, homeSheet: string): FormulaNode {
  const p = new Parser(formula, homeSheet);
  return p.parseWhole();
}

/** Every reference a formula holds (ranges and table columns), for recalculation when one of them changes. */
export function references(node: FormulaNode): Extract<FormulaNode, { kind: 'ref' | 'tableref' }>[] {
  if (node.kind === 'ref' || node.kind === 'tableref') return [node];
  if (node.kind === 'call') return node.args.flatMap(references);
  return [];
}

class Parser {
  private pos = 0;
  private depth = 0;
  constructor(private readonly text: string, private readonly homeSheet: string) {}

  parseWhole(): FormulaNode {
    if (!this.text.startsWith('=')) throw new FormulaSyntaxError('a formula starts with "="');
    this.pos = 1;
    const node = this.parseExpression(false);
    this.skipSpace();
    if (this.pos < this.text.length) this.fail(`unexpected "${this.text.slice(this.pos, this.pos + 10)}"`);
    return node;
  }

  private fail(message: string): never {
    throw new FormulaSyntaxError(`${message} (at character ${this.pos + 1})`);
  }

  private skipSpace(): void {
    while (this.pos < this.text.length && /\s/.test(this.text[this.pos])) this.pos++;
  }

  private peek(): string {
    return this.text[this.pos] ?? '';
  }

  private parseExpression(inArguments: boolean): FormulaNode {
    this.skipSpace();
    const c = this.peek();
    if (inArguments && (c === ',' || c === ')')) return { kind: 'omitted' };
    if (c === '') this.fail('the formula ends too early');
    if (c === '"') return { kind: 'literal', value: this.readString() };
    if (c === '{') return this.readArray();
    if (c === "'") return this.readReference(this.readQuotedSheet());
    if (/[0-9.+-]/.test(c)) return { kind: 'literal', value: this.readNumber() };
    if (/[A-Za-z_$]/.test(c)) {
      const start = this.pos;
      const word = this.readWord();
      this.skipSpace();
      const next = this.peek();
      if (next === '(') return this.readCall(word);
      if (next === '!') return this.readReference(word);
      if (next === '[') return this.readTableReference(word, start);
      const upper = word.toUpperCase();
      if ((upper === 'TRUE' || upper === 'FALSE') && next !== ':') return { kind: 'literal', value: upper === 'TRUE' };
      this.pos = start;
      return this.readReference(undefined);
    }
    return this.fail(`unexpected "${c}"`);
  }

  private readWord(): string {
    const m = /^[A-Za-z_$][A-Za-z0-9_.$]*/.exec(this.text.slice(this.pos));
    if (!m) this.fail('expected a name');
    this.pos += m[0].length;
    return m[0];
  }

  private readString(): string {
    this.pos++; // opening quote
    let out = '';
    while (this.pos < this.text.length) {
      const c = this.text[this.pos];
      if (c === '"') {
        if (this.text[this.pos + 1] === '"') {
          out += '"';
          this.pos += 2;
          continue;
        }
        this.pos++;
        return out;
      }
      out += c;
      this.pos++;
    }
    return this.fail('text is missing its closing "');
  }

  private readNumber(): number {
    const m = /^[+-]?\s*(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?%?/.exec(this.text.slice(this.pos));
    if (!m) return this.fail('expected a number');
    this.pos += m[0].length;
    const body = m[0].replace(/\s+/g, '');
    return body.endsWith('%') ? Number(body.slice(0, -1)) / 100 : Number(body);
  }

  private readQuotedSheet(): string {
    this.pos++; // opening '
    let name = '';
    while (this.pos < this.text.length) {
      const c = this.text[this.pos];
      if (c === "'") {
        if (this.text[this.pos + 1] === "'") {
          name += "'";
          this.pos += 2;
          continue;
        }
        this.pos++;
        this.skipSpace();
        if (this.peek() !== '!') this.fail('a quoted sheet name must be followed by "!"');
        return name;
      }
      name += c;
      this.pos++;
    }
    return this.fail("a sheet name is missing its closing '");
  }

  /** Reads "B2", "B2:C9" or "B:C" after an optional sheet name (the "!" is still ahead when a sheet was read). */
  private readReference(sheet: string | undefined): FormulaNode {
    if (sheet !== undefined) {
      this.skipSpace();
      if (this.peek() !== '!') this.fail('expected "!" after the sheet name');
      this.pos++;
    }
    const m = /^\$?[A-Za-z]{1,3}\$?\d*(\s*:\s*\$?[A-Za-z]{1,3}\$?\d*)?/.exec(this.text.slice(this.pos));
    if (!m) return this.fail('expected a cell or range such as B2:B49');
    const cells = m[0].replace(/\s+/g, '');
    const area = parseArea(cells, sheet ?? this.homeSheet);
    if (!area) return this.fail(`"${cells}" is not a cell or range`);
    if (sheet !== undefined) area.sheet = sheet;
    this.pos += m[0].length;
    return { kind: 'ref', text: cells, area };
  }

  /** Reads "[Column]", "[[Column]]" or "[[#Data],[Column]]" after a table name; ' escapes [ ] # and '. */
  private readTableReference(table: string, start: number): FormulaNode {
    const specifiers: string[] = [];
    const readBracket = (): string => {
      this.pos++; // [
      let out = '';
      while (this.pos < this.text.length) {
        const c = this.text[this.pos];
        if (c === "'") {
          out += this.text[this.pos + 1] ?? '';
          this.pos += 2;
          continue;
        }
        if (c === ']') {
          this.pos++;
          return out;
        }
        if (c === '[') this.fail('unexpected "[" inside a column name (write \'[ for a literal bracket)');
        out += c;
        this.pos++;
      }
      return this.fail(`${table}[ is missing its closing "]"`);
    };
    if (this.text[this.pos + 1] === '[') {
      this.pos++; // outer [
      for (;;) {
        this.skipSpace();
        if (this.peek() !== '[') this.fail('expected "[" in the table reference');
        specifiers.push(readBracket());
        this.skipSpace();
        if (this.peek() === ',') {
          this.pos++;
          continue;
        }
        if (this.peek() === ']') {
          this.pos++;
          break;
        }
        this.fail('expected "," or "]" in the table reference');
      }
    } else {
      specifiers.push(readBracket());
    }
    let part: TablePart = 'data';
    const columns: string[] = [];
    for (const spec of specifiers) {
      const lower = spec.trim().toLowerCase();
      if (lower === '#data') part = 'data';
      else if (lower === '#headers') part = 'headers';
      else if (lower === '#all') part = 'all';
      else if (lower.startsWith('#')) this.fail(`${spec} is not supported in a table reference`);
      else columns.push(spec);
    }
    if (columns.length !== 1) this.fail('a table reference needs exactly one column, e.g. Table1[Visits]');
    return { kind: 'tableref', text: this.text.slice(start, this.pos), table, column: columns[0], part };
  }

  private readCall(name: string): FormulaNode {
    if (++this.depth > MAX_NESTING) {
      throw new FormulaSyntaxError(`functions are nested more than ${MAX_NESTING} deep (the most a spreadsheet formula allows); split the formula into cells`);
    }
    this.pos++; // (
    const args: FormulaNode[] = [];
    this.skipSpace();
    if (this.peek() === ')') {
      this.pos++;
      this.depth--;
      return { kind: 'call', name, args };
    }
    for (;;) {
      args.push(this.parseExpression(true));
      this.skipSpace();
      const c = this.peek();
      if (c === ',') {
        this.pos++;
        continue;
      }
      if (c === ')') {
        this.pos++;
        this.depth--;
        return { kind: 'call', name, args };
      }
      this.fail(c === '' ? `${name}( is missing its closing ")"` : `expected "," or ")" but found "${c}"`);
    }
  }

  private readArray(): FormulaNode {
    this.pos++; // {
    const rows: Scalar[][] = [[]];
    for (;;) {
      this.skipSpace();
      const c = this.peek();
      let value: Scalar;
      if (c === '"') value = this.readString();
      else if (/[0-9.+-]/.test(c)) value = this.readNumber();
      else if (/[A-Za-z]/.test(c)) {
        const w = this.readWord().toUpperCase();
        if (w !== 'TRUE' && w !== 'FALSE') this.fail('an array constant holds only numbers, text and TRUE/FALSE');
        value = w === 'TRUE';
      } else return this.fail('expected a value inside { }');
      rows[rows.length - 1].push(value);
      this.skipSpace();
      const sep = this.peek();
      this.pos++;
      if (sep === ',') continue;
      if (sep === ';') {
        rows.push([]);
        continue;
      }
      if (sep === '}') break;
      this.pos--;
      this.fail('expected ",", ";" or "}" in the array constant');
    }
    if (rows.some((r) => r.length !== rows[0].length)) this.fail('every row of an array constant needs the same number of values');
    return { kind: 'array', rows };
  }
}
