import type { Rules } from './schema';

/**
 * Rules a new plan starts with: 30 s headway between one train leaving a block and the next
 * entering it, a 2 s start-up surge at stall current, and supplies loaded continuously to at most
 * 80 % of their rating (rule of thumb; the same 80 % appears for continuous loads in NEC 210.20(A)).
 */
export const defaultRules: Rules = { headwayS: 30, surgeS: 2, derate: 0.8 };

/** Loads within this many amps of a limit count as within it, so a load equal to its limit passes. */
export const AMPS_TOLERANCE = 1e-9;

/** Voltages within this many volts of a rating count as within it. */
export const VOLTS_TOLERANCE = 1e-9;

/**
 * Two times closer than this (1 ms) count as the same time: a clash must be longer, and a gap
 * wider, than this, so that rounding in sums of seconds (5.5e-17 s) never makes a finding.
 */
export const TIME_TOLERANCE_S = 0.001;
