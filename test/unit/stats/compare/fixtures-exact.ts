/**
 * Typed access to power-exact-mpmath.json: Hotelling's (1953) density of r integrated with mpmath 1.2.1 at 30
 * digits, critical values from scipy 1.10.1 (script power-exact-mpmath.py beside it, calls recorded inside).
 */
import exactJson from '../../../fixtures/compare/power-exact-mpmath.json';
import { Tail } from '../../../../src/stats/types';

export const EXACT = exactJson as unknown as {
  versions: Record<string, string>;
  alpha: number;
  power: { r: number; n: number; tail: Tail; power: number }[];
  total_mass: { r: number; n: number; mass: number }[];
  sample_size: { r: number; power: number; tail: Tail; n: number; power_at_n: number; power_at_n_minus_1: number }[];
  detectable: { n: number; power: number; tail: Tail; r: number }[];
};

