/**
 * Growth values read back from a run: μmax from the exponential phase of the measured biomass (the
 * growth fit of chemistry/growth-fit), Yx/s from the biomass made over the carbon source used
 * (what was there and fed, less what is left), and Yx/O2 from the biomass made over the O2 the
 * off-gas balance says was consumed over the same time.
 */
import { ChemistryInputError } from '../errors';
import { fitGrowthCurve } from '../growth-fit/fit';
import type { Estimate } from '../growth-fit/types';
import { interpolateAt, type TimeSeries } from './series';

const O2_G_PER_MOL = 31.998;

export interface LearnInput {
	biomassGPerL: TimeSeries;
	substrateGPerL?: TimeSeries | null;
	/** broth volume at a time, L */
	volumeAtL: (timeH: number) => number;
	/** feed added by a time, L (cumulative); none when the run was not fed */
	feedAddedL?: TimeSeries | null;
	/** the carbon source in the feed, g/L */
	feedSubstrateGPerL?: number | null;
	/** O2 consumed by a time, mol, from the off-gas balance */
	cumulativeO2Mol?: TimeSeries | null;
}

export interface LearnedValue<T> {
	value: T | null;
	/** how it was found, or why not */
	basis: string;
}

export interface LearnedGrowth {
	muMaxPerH: LearnedValue<Estimate>;
	yieldXSGPerG: LearnedValue<number>;
	yieldXO2GPerG: LearnedValue<number>;
}

const round = (x: number) => Number(x.toPrecision(3));

function learnMuMax(biomass: TimeSeries): LearnedValue<Estimate> {
	try {
		const fit = fitGrowthCurve({ timeH: biomass.timeH, biomassGPerL: biomass.value });
		const phase = fit.exponentialPhase;
		return {
			value: phase.muMaxPerH,
			basis: `exponential phase ${round(phase.startH)}–${round(phase.endH)} h, ${phase.pointCount} samples, R² ${phase.rSquared.toFixed(3)}`
		};
	} catch (cause) {
		if (cause instanceof ChemistryInputError) return { value: null, basis: cause.message };
		throw cause;
	}
}

/** First and last biomass samples: the stretch the yields are counted over. */
function span(biomass: TimeSeries) {
	const n = biomass.timeH.length;
	return {
		t0: biomass.timeH[0],
		t1: biomass.timeH[n - 1],
		x0: biomass.value[0],
		x1: biomass.value[n - 1]
	};
}

export function learnFromRun(input: LearnInput): LearnedGrowth {
	const biomass = input.biomassGPerL;
	if (biomass.timeH.length < 2) {
		const none = { value: null, basis: 'Needs at least two dry-weight samples.' };
		return { muMaxPerH: learnMuMax(biomass), yieldXSGPerG: none, yieldXO2GPerG: none };
	}
	const { t0, t1, x0, x1 } = span(biomass);
	const v0 = input.volumeAtL(t0);
	const v1 = input.volumeAtL(t1);
	const madeG = x1 * v1 - x0 * v0;

	let yieldXSGPerG: LearnedValue<number>;
	const s = input.substrateGPerL;
	if (!s || s.timeH.length < 2) {
		yieldXSGPerG = { value: null, basis: 'Needs substrate samples at the start and end.' };
	} else {
		const s0 = interpolateAt(s, t0)!;
		const s1 = interpolateAt(s, t1)!;
		const fedL = input.feedAddedL
			? (interpolateAt(input.feedAddedL, t1) ?? 0) - (interpolateAt(input.feedAddedL, t0) ?? 0)
			: 0;
		const feedS = input.feedSubstrateGPerL ?? null;
		if (fedL > 0 && feedS === null) {
			yieldXSGPerG = {
				value: null,
				basis: 'The run was fed, and the feed’s carbon source concentration is unknown.'
			};
		} else {
			const usedG = s0 * v0 + (feedS ?? 0) * fedL - s1 * v1;
			yieldXSGPerG =
				usedG > 0 && madeG > 0
					? {
							value: madeG / usedG,
							basis: `${round(madeG)} g biomass made over ${round(usedG)} g carbon source used, ${round(t0)}–${round(t1)} h${fedL > 0 ? ` (with ${round(fedL)} L of feed at ${feedS} g/L)` : ''}`
						}
					: {
							value: null,
							basis: 'No net growth or no substrate used between the first and last samples.'
						};
		}
	}

	let yieldXO2GPerG: LearnedValue<number>;
	const o2 = input.cumulativeO2Mol;
	if (!o2 || o2.timeH.length < 2) {
		yieldXO2GPerG = { value: null, basis: 'Needs exhaust gas data (O₂ and CO₂) and the gas flow.' };
	} else if (t0 < o2.timeH[0] || t1 > o2.timeH[o2.timeH.length - 1]) {
		yieldXO2GPerG = {
			value: null,
			basis:
				'The exhaust gas data do not cover the stretch between the first and last dry-weight samples.'
		};
	} else {
		const consumedG = (interpolateAt(o2, t1)! - interpolateAt(o2, t0)!) * O2_G_PER_MOL;
		yieldXO2GPerG =
			consumedG > 0 && madeG > 0
				? {
						value: madeG / consumedG,
						basis: `${round(madeG)} g biomass made over ${round(consumedG)} g O₂ consumed, ${round(t0)}–${round(t1)} h`
					}
				: { value: null, basis: 'No net growth or no O₂ consumed between the samples.' };
	}
	return { muMaxPerH: learnMuMax(biomass), yieldXSGPerG, yieldXO2GPerG };
}
