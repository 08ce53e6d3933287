// The growth fit's input and result shapes, and the limits shared by its parts.

export interface GrowthCurveData {
	timeH: number[];
	biomassGPerL: number[];
	substrateGPerL?: number[];
	dissolvedOxygenMgPerL?: number[];
	/** fewest points in the exponential window; default and least MIN_GROWTH_FIT_POINTS (4) */
	minWindowPoints?: number;
	/** default 0.98 */
	minRSquared?: number;
	/** fit Yx/s with the whole curve (default) or hold it at the −dX/dS estimate */
	fitYield?: boolean;
	/** points in the fitted curves; default 200 */
	curvePoints?: number;
}

export interface Estimate {
	value: number;
	standardError: number;
	/** 95 % confidence bounds; null where the interval is unbounded */
	lower95: number | null;
	upper95: number | null;
}

/** A whole-curve parameter: its interval comes from ln θ, so the standard error is θ·SE(ln θ). */
export interface ParameterEstimate {
	value: number;
	/** null where the data do not determine the parameter */
	standardError: number | null;
	/** 95 % confidence bounds; null where the interval is unbounded */
	lower95: number | null;
	upper95: number | null;
	/** the interval spans more than a factor of 3, or is unbounded */
	poorlyDetermined: boolean;
}

export interface MonodFit {
	muMaxPerH: number;
	ksGPerL: number;
	yieldXS: number;
	/** X and S at `startH`, where the fit begins (the exponential phase's first point) */
	initialBiomassGPerL: number;
	initialSubstrateGPerL: number;
	startH: number;
	biomassRmsGPerL: number;
	substrateRmsGPerL: number;
	iterations: number;
	estimates: {
		muMaxPerH: ParameterEstimate;
		ksGPerL: ParameterEstimate;
		/** null when Yx/s was held at the −dX/dS estimate */
		yieldXS: ParameterEstimate | null;
	};
	/** residual degrees of freedom of the intervals: 2·points − parameters */
	degreesOfFreedom: number;
	curve: { t: number[]; biomassGPerL: number[]; substrateGPerL: number[] };
}

export interface GrowthFit {
	exponentialPhase: {
		startIndex: number;
		endIndex: number;
		startH: number;
		endH: number;
		pointCount: number;
		rSquared: number;
		/** points in the longest straight window, of which the reported one holds at least 60 % */
		longestStraightPointCount: number;
		/** measurement noise of ln X used by the window tests (standard deviation) */
		noiseSdLn: number;
		muMaxPerH: Estimate;
		doublingTimeH: Estimate;
		curve: { t: number[]; biomassGPerL: number[] };
	};
	/** indices left out of the exponential-phase search for low DO */
	oxygenLimitedIndices: number[];
	yieldXS: Estimate | null;
	/** null without substrate data (Ks cannot be told apart from Yx/s on biomass alone) or when the fit failed (see warnings) */
	monodFit: MonodFit | null;
	/** plain-words cautions about the results: poorly determined parameters, a failed whole-curve fit */
	warnings: string[];
}

/** Fewest points a growth fit accepts (the default shortest exponential window). */
export const MIN_GROWTH_FIT_POINTS = 4;

/** Fraction of the longest straight window's points the reported window keeps (see the top of this file). */
export const WINDOW_LENGTH_FRACTION = 0.6;

/** An interval spanning more than this factor marks a whole-curve parameter as poorly determined. */
export const POORLY_DETERMINED_FACTOR = 3;

export interface MonodBatchParameters {
	muMaxPerH: number;
	ksGPerL: number;
	yieldXS: number;
	initialBiomassGPerL: number;
	initialSubstrateGPerL: number;
}

export interface MonodCurveData {
	timeH: number[];
	biomassGPerL: number[];
	substrateGPerL: number[];
	/** starting value for μmax, e.g. the exponential-phase slope */
	muMaxGuessPerH: number;
	/** starting value for Yx/s, and its value when fitYield is false; default ΔX/ΔS end to end */
	yieldXSGuess?: number | null;
	/** fit Yx/s (default) or hold it at yieldXSGuess */
	fitYield?: boolean;
	/** points in the fitted curves; default 200 */
	curvePoints?: number;
}
