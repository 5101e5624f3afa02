/**
 * The panel's note on what Excel on the web passes a cell function (about 5 MB of arguments per call, reported
 * by the platform's maintainers; see host-limits.ts). The bytes are those of the cells as JSON, computed here by
 * JSON.stringify on the same cells, not by the module's own estimate.
 */
import { bytesPerCell, functionCallNote, WEB_FUNCTION_ARGUMENT_BYTES } from '../../../taskpane/host-limits';

const column = (n: number, f: (i: number) => number) => Float64Array.from({ length: n }, (_, i) => f(i));

test('bytes per cell follow the JSON the host sends (within a few bytes of JSON.stringify)', () => {
  const c = column(5000, (i) => Math.sin(i) * 1000);
  const json = JSON.stringify(Array.from(c, (v) => [v])).length / c.length;
  expect(Math.abs(bytesPerCell([c]) - json)).toBeLessThan(2);
  const cents = column(5000, (i) => Math.round(i * 137.31) / 100);
  const jsonCents = JSON.stringify(Array.from(cents, (v) => [v])).length / cents.length;
  expect(Math.abs(bytesPerCell([cents]) - jsonCents)).toBeLessThan(2);
});

test('no note on desktop, nor when the columns fit; a note with the rows that fit when they do not', () => {
  const big = [column(300000, (i) => Math.sin(i) * 1000), column(300000, (i) => Math.cos(i) * 1000)];
  expect(functionCallNote(null, big)).toBeNull();
  expect(functionCallNote(WEB_FUNCTION_ARGUMENT_BYTES, [column(1000, Math.sin), column(1000, Math.cos)])).toBeNull();
  const note = functionCallNote(WEB_FUNCTION_ARGUMENT_BYTES, big)!;
  expect(note).toMatch(/^Excel on the web hands a cell function about 5 MB of cells per call: a COVARY formula over all 300,000 rows of these 2 columns would fail there with #VALUE! \(about [\d,]+ rows fit\)\./);
  const fit = Number(/about ([\d,]+) rows fit/.exec(note)![1].replace(/,/g, ''));
  // Check the figure against the JSON of that many rows of both columns.
  const json = JSON.stringify(Array.from({ length: fit }, (_, i) => [big[0][i], big[1][i]])).length;
  expect(json).toBeLessThanOrEqual(WEB_FUNCTION_ARGUMENT_BYTES * 1.05);
  expect(json).toBeGreaterThan(WEB_FUNCTION_ARGUMENT_BYTES * 0.8);
});
