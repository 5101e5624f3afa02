/**
 * Demo data for the workbench: Quarrow Vale Cycle Works, an invented chain of bike-repair workshops in an invented
 * county, with a northern and a southern region and four years of monthly figures. Every number is made here from a
 * fixed seed, so it is the same on every load. Each pair of columns is built to show one thing the panel checks:
 *
 * | Columns (North, South)                    | What it shows                                           |
 * | ----------------------------------------- | ------------------------------------------------------- |
 * | Mechanics (FTE) – Repairs per week        | a clean straight-line relationship (the demo pair)      |
 * | Parts discount % – Margin %               | a curve: margin rises with discount, then falls         |
 * | Floor area m² – Rent per month            | one rent typed with a slip (an outlier)                 |
 * | E-bike share % – Average ticket           | one flagship workshop alone sets the slope              |
 * | Households nearby (k) – Revenue per week  | spread that widens with size (a fan); one blank revenue |
 * | Months: Ad spend – Repairs booked         | two series that both trend, so rows depend on order     |
 *
 * The South region has the same columns with a weaker staffing relationship, so comparing North with South is
 * ready to try.
 */
import { SeededRandom, roundTo } from './seeded-random';
import type { TypedCell } from './workbook-editor';

export interface DemoSheet {
  name: string;
  /** Row 1 is the header row; rows below are data. */
  cells: TypedCell[][];
  /** Named table over the header and data rows of columns A.. (width = header length), if any. */
  table?: { name: string; columns: number; rows: number };
  /** Extra entries (labels and formulas) at their cells, e.g. { at: [2, 14], entry: "=COVARY.COEF(...)" }. */
  extras?: { row: number; column: number; entry: TypedCell }[];
}

export const COMPANY = 'Quarrow Vale Cycle Works';

export const WORKSHOP_HEADERS = [
  'Workshop',
  'Mechanics (FTE)',
  'Repairs per week',
  'Parts discount %',
  'Margin %',
  'Floor area m²',
  'Rent per month',
  'E-bike share %',
  'Average ticket',
  'Households nearby (k)',
  'Revenue per week',
];

const clamp = (v: number, low: number, high: number): number => Math.min(high, Math.max(low, v));

interface RegionRecipe {
  prefix: string;
  count: number;
  seed: number;
  /** Repairs per week = repairsPerMechanic × mechanics + repairsBase + noise(sd = repairsNoise). */
  repairsPerMechanic: number;
  repairsBase: number;
  repairsNoise: number;
  /** Row (1-based sheet row) whose rent was typed with a slip, and the row of the e-bike flagship. */
  rentSlipRow: number;
  flagshipRow: number;
  /** Row whose weekly revenue was not reported (left blank). */
  blankRevenueRow: number;
}

function workshops(r: RegionRecipe): TypedCell[][] {
  const rng = new SeededRandom(r.seed);
  const rows: TypedCell[][] = [WORKSHOP_HEADERS.slice()];
  for (let i = 1; i <= r.count; i++) {
    const sheetRow = i + 1;
    const mechanics = roundTo(clamp(rng.normal(5.5, 1.7), 1.5, 9.5), 1);
    const repairs = Math.round(r.repairsPerMechanic * mechanics + r.repairsBase + rng.normal(0, r.repairsNoise));

    // Margin peaks at an 18% parts discount and falls either side: a curve a straight line misreads.
    const discount = roundTo(clamp(rng.normal(15, 7), 0, 30), 1);
    const margin = roundTo(30 - 0.06 * (discount - 18) ** 2 + rng.normal(0, 1.0), 1);

    const area = 5 * Math.round(clamp(rng.normal(150, 40), 60, 240) / 5);
    let rent = roundTo(14 * area + 300 + rng.normal(0, 220), -1);
    // One rent was keyed wrong (about three times its real value): an outlier at an ordinary floor area.
    if (sheetRow === r.rentSlipRow) rent = roundTo(rent * 3, -1);

    // E-bike share is low everywhere but at the flagship; the ticket does not follow the share elsewhere.
    let ebike = roundTo(clamp(rng.normal(6.5, 2.2), 1, 12), 1);
    let ticket = roundTo(58 + rng.normal(0, 7), 2);
    if (sheetRow === r.flagshipRow) {
      ebike = 64;
      ticket = 121.5;
    }

    // Revenue grows with households, and so does its spread: a fan.
    const households = roundTo(clamp(rng.normal(30, 11), 5, 60), 1);
    const revenue = roundTo(180 * households + rng.normal(0, 60 * households), 0);

    rows.push([
      `${r.prefix}${String(i).padStart(2, '0')}`,
      mechanics,
      repairs,
      discount,
      margin,
      area,
      rent,
      ebike,
      ticket,
      households,
      sheetRow === r.blankRevenueRow ? null : revenue,
    ]);
  }
  return rows;
}

const MONTH_HEADERS = ['Month', 'Ad spend', 'Repairs booked', 'Rainy days'];

/** Four years of monthly figures: spend and bookings both trend upward, with slow-moving (autocorrelated) noise. */
function months(seed: number, count: number): TypedCell[][] {
  const rng = new SeededRandom(seed);
  const rows: TypedCell[][] = [MONTH_HEADERS.slice()];
  let spendDrift = 0;
  let bookingDrift = 0;
  for (let t = 1; t <= count; t++) {
    const year = 2022 + Math.floor((t - 1) / 12);
    const month = ((t - 1) % 12) + 1;
    const season = Math.sin((2 * Math.PI * (month - 4)) / 12); // peaks in early summer
    // AR(1) drifts (coefficient 0.85): each month's noise carries most of the last month's.
    spendDrift = 0.85 * spendDrift + rng.normal(0, 60);
    bookingDrift = 0.85 * bookingDrift + rng.normal(0, 22);
    const spend = roundTo(900 + 28 * t + 160 * season + spendDrift, -1);
    const bookings = Math.round(320 + 5.5 * t + 70 * season + bookingDrift);
    const rainy = Math.max(2, Math.round(13 - 5 * season + rng.normal(0, 2)));
    rows.push([`${year}-${String(month).padStart(2, '0')}`, spend, bookings, rainy]);
  }
  return rows;
}

/** Live formulas beside the North table (columns M:O), over the demo pair. */
function northFormulas(lastRow: number): DemoSheet['extras'] {
  const x = `B2:B${lastRow}`;
  const y = `C2:C${lastRow}`;
  const at = (row: number, column: number, entry: TypedCell) => ({ row, column, entry });
  return [
    at(1, 13, 'Mechanics vs repairs'),
    at(1, 14, 'Live formula'),
    at(2, 13, 'r'),
    at(2, 14, `=COVARY.COEF(${x}, ${y})`),
    at(3, 13, '95% interval'),
    at(3, 14, `=COVARY.INTERVAL(${x}, ${y})`),
    at(4, 13, 'p-value'),
    at(4, 14, `=COVARY.PVALUE(${x}, ${y})`),
    at(5, 13, 'Pairs used'),
    at(5, 14, `=COVARY.PAIRS(${x}, ${y})`),
    at(6, 13, 'Spearman rho'),
    at(6, 14, `=COVARY.COEF(${x}, ${y}, "spearman")`),
  ];
}

/**
 * A sheet of live formulas across the other sheets: each demo pair with its r and the flags its checks raise, the
 * North–South comparison, a reported correlation checked, and a sample size. Shows sheet-qualified and quoted
 * ranges, omitted arguments and spilled results.
 */
function formulaSheet(northLast: number, southLast: number, monthsLast: number): DemoSheet {
  const n = (c: string) => `North!${c}2:${c}${northLast}`;
  const s = (c: string) => `South!${c}2:${c}${southLast}`;
  const m = (c: string) => `'Monthly figures'!${c}2:${c}${monthsLast}`;
  const pair = (label: string, x: string, y: string): TypedCell[] => [label, `=COVARY.COEF(${x}, ${y})`, `=COVARY.FLAGS(${x}, ${y})`];
  const cells: TypedCell[][] = [
    ['Pair (sheet): what it shows', 'r', 'Flags from the checks'],
    pair('Mechanics vs repairs (North): clean', n('B'), n('C')),
    pair('Mechanics vs repairs (South): clean, weaker', s('B'), s('C')),
    pair('Parts discount vs margin (North): curved', n('D'), n('E')),
    pair('Floor area vs rent (North): one rent keyed wrong', n('F'), n('G')),
    pair('E-bike share vs ticket (North): one flagship', n('H'), n('I')),
    pair('Households vs revenue (North): spread widens', n('J'), n('K')),
    pair('Ad spend vs repairs booked (Monthly figures): both trend', m('B'), m('C')),
    [],
    ['North minus South, mechanics vs repairs', 'difference', 'lower', 'upper', 'p-value'],
    ['', `=COVARY.DIFF_GROUPS(${n('B')}, ${n('C')}, ${s('B')}, ${s('C')})`],
    [],
    ['A reported r of 0.42 from 30 pairs', 'lower', 'upper', 'p-value'],
    ['95% (defaults)', '=COVARY.REPORTED(0.42, 30)'],
    ['90% (level given, tail omitted)', '=COVARY.REPORTED(0.42, 30, 0.9, , "pearson")'],
    [],
    ['Pairs needed to find r = 0.3 with 80% power', '=COVARY.SAMPLE_SIZE(0.3, 0.8)'],
    ['Spearman rho, floor area vs rent (North)', `=COVARY.COEF(${n('F')}, ${n('G')}, "spearman")`],
    ['Kendall tau-b, discount vs margin (North)', `=COVARY.COEF(${n('D')}, ${n('E')}, "kendall")`],
  ];
  return { name: 'Live formulas', cells };
}

/** The demo workbook, sheet by sheet. */
export function demoWorkbook(): DemoSheet[] {
  const north = workshops({
    prefix: 'N', count: 48, seed: 20260441, repairsPerMechanic: 9.5, repairsBase: 6, repairsNoise: 9,
    rentSlipRow: 28, flagshipRow: 41, blankRevenueRow: 13,
  });
  const south = workshops({
    prefix: 'S', count: 40, seed: 20260442, repairsPerMechanic: 7, repairsBase: 15, repairsNoise: 13,
    rentSlipRow: 17, flagshipRow: 33, blankRevenueRow: 9,
  });
  const monthly = months(20260303, 48);
  return [
    { name: 'North', cells: north, table: { name: 'NorthWorkshops', columns: WORKSHOP_HEADERS.length, rows: north.length }, extras: northFormulas(north.length) },
    { name: 'South', cells: south, table: { name: 'SouthWorkshops', columns: WORKSHOP_HEADERS.length, rows: south.length } },
    { name: 'Monthly figures', cells: monthly, table: { name: 'MonthlyFigures', columns: MONTH_HEADERS.length, rows: monthly.length } },
    formulaSheet(north.length, south.length, monthly.length),
  ];
}
