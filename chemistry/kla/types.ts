// Shapes of the kLa fits: the gassing-out test and the dynamic method during a run.
import type { Estimate } from '../growth-fit/types';

export type { Estimate };

/** How the DO readings are given: percent of air saturation, or mg/L. */
export type DissolvedOxygenUnit = 'percentSaturation' | 'mgPerL';

export interface GassingOutInput {
	timeS: number[];
	/** DO readings in `dissolvedOxygenUnit` (percent of saturation unless told otherwise) */
	dissolvedOxygen: number[];
	dissolvedOxygenUnit?: DissolvedOxygenUnit;
	/** first-order probe time constant τp; null or left out: the probe is taken as instantaneous */
	probeTimeConstantS?: number | null;
	/** when the DO starts to rise (gas switched on); earlier points are left out. Default: the first time */
	startS?: number;
	/** points in the fitted curve (default 200) */
	curvePoints?: number;
}

export interface GassingOutFit {
	kLaPerH: Estimate;
	kLaPerS: Estimate;
	/** the plateau C* and the start C0, in the unit the DO was given in */
	saturation: Estimate;
	initial: Estimate;
	dissolvedOxygenUnit: DissolvedOxygenUnit;
	probeTimeConstantS: number | null;
	startS: number;
	/** the points fitted (from startS on) */
	pointsUsed: number;
	degreesOfFreedom: number;
	/** reading − fitted probe reading at each point used */
	residuals: number[];
	residualSd: number;
	rSquared: number;
	/** the fitted probe reading on an even grid from startS to the last time */
	curve: { timeS: number[]; dissolvedOxygen: number[] };
	/** covariance of (kLa in 1/s, C*, C0) from s²(JᵀJ)⁻¹ */
	covariance: number[][];
	warnings: string[];
}

export interface DynamicMethodSegment {
	timeS: number[];
	dissolvedOxygen: number[];
}

export interface DynamicMethodInput {
	/** the air is off: DO falls at the uptake rate */
	gasOff: DynamicMethodSegment;
	/** the air is back on: DO recovers towards its steady value */
	gasOn: DynamicMethodSegment;
	dissolvedOxygenUnit?: DissolvedOxygenUnit;
	/** C* in mg/L, to express percent readings as mg/L; needed for OUR in mg/L/h from percent data */
	saturationMgPerL?: number | null;
	probeTimeConstantS?: number | null;
	/** when the air came back on; default the first gas-on time */
	gasOnStartS?: number;
}

export interface DynamicMethodResult {
	/** −slope of the gas-off segment, in the DO unit per hour */
	ourPerH: Estimate;
	/** OUR in mg/L/h and mmol/L/h; null when percent data come without saturationMgPerL */
	ourMgPerLH: Estimate | null;
	ourMmolPerLH: Estimate | null;
	kLaPerH: Estimate;
	kLaPerS: Estimate;
	/** the DO the recovery levels off at, C∞ = C* − OUR/kLa, in the DO unit */
	steadyDissolvedOxygen: Estimate;
	/** C* = C∞ + OUR/kLa with its standard error by the delta method, in the DO unit */
	saturation: { value: number; standardError: number };
	dissolvedOxygenUnit: DissolvedOxygenUnit;
	gasOffRSquared: number;
	recovery: GassingOutFit;
	warnings: string[];
}
