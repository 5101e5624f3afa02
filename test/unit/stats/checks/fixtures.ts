/** Typed access to the reference fixtures of the checks (R: checks-r.json; scipy: normaltest-scipy.json). */
import rJson from '../../../fixtures/checks/checks-r.json';
import scipyJson from '../../../fixtures/checks/normaltest-scipy.json';
import { SimulatedKind } from './simulated-data';

export interface RChecks {
  n: number;
  slope: number;
  intercept: number;
  sw_x: { W: number; p: number } | null;
  sw_y: { W: number; p: number } | null;
  sw_e: { W: number; p: number } | null;
  curvature?: { F: number; p: number; reset_F: number; reset_p: number };
  bp: { statistic: number; p: number };
  outlier: { index: number; rstudent: number; bonferroni_p: number; car_bonf_p: number };
  cook: { index: number; max: number; cutoff: number; max_hat: number };
  points?: { rstudent: (number | null)[]; cooks: (number | null)[]; hat: number[] };
  dw: {
    statistic: number; p_greater: number; p_two_sided: number; p_less: number; exact: boolean;
    imhof_below?: number; imhof_above?: number;
  };
}

export interface RAnscombe extends RChecks { x: number[]; y: number[] }
export interface RSimulated extends RChecks { kind: SimulatedKind; x_head: number[]; y_sum: number }

export const R = rJson as unknown as {
  r_version: string;
  anscombe: RAnscombe[];
  simulated: RSimulated[];
  shapiro: { name: string; x: number[]; W: number; p: number }[];
  shapiro_generated: { seed: number; n: number; transform: 'none' | 'cube'; W: number; p: number }[];
};

export interface ScipyTests {
  k2: number; k2_p: number; skew_z: number; skew_p: number; kurt_z: number; kurt_p: number;
  skewness: number; excess_kurtosis: number;
}

export const SCIPY = scipyJson as unknown as {
  scipy: string;
  cases: { kind: SimulatedKind; n: number; x: ScipyTests; y: ScipyTests; residuals: ScipyTests }[];
  docstrings: { skewtest_1_to_8: { z: number; p: number }; kurtosistest_0_to_19: { z: number; p: number } };
};
