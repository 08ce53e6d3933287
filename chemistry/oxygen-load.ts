/**
 * What a simulated run asks of a vessel's gas supply and cooling: the peak oxygen uptake rate per
 * litre (what kLa·(C* − C_set) must match) and the peak uptake of the whole culture, OUR·V (what the
 * metabolic heat follows, Q = q_O2·OUR·V; Cooney, Wang & Mateles 1969). The two peaks need not fall at
 * the same time: a fed-batch's volume grows while its OUR levels off.
 */
import { ChemistryInputError } from './errors';

export interface OxygenLoadSeries {
	t: readonly number[];
	ourMmolPerLH: readonly number[];
	volumeL: readonly number[];
}

export interface PeakOxygenLoad {
	peakOurMmolPerLH: number;
	peakOurAtH: number;
	/** largest OUR·V, mmol O2/h */
	peakUptakeMmolPerH: number;
	peakUptakeAtH: number;
	/** OUR and V where OUR·V peaks */
	peakUptakeOurMmolPerLH: number;
	peakUptakeVolumeL: number;
}

export function findPeakOxygenLoad(series: OxygenLoadSeries): PeakOxygenLoad {
	const { t, ourMmolPerLH: our, volumeL } = series;
	if (t.length === 0 || our.length !== t.length || volumeL.length !== t.length) {
		throw new ChemistryInputError('The series need the same, non-zero number of points.', { field: 'ourMmolPerLH' });
	}
	let ourAt = 0;
	let uptakeAt = 0;
	for (let i = 1; i < t.length; i++) {
		if (our[i] > our[ourAt]) ourAt = i;
		if (our[i] * volumeL[i] > our[uptakeAt] * volumeL[uptakeAt]) uptakeAt = i;
	}
	return {
		peakOurMmolPerLH: our[ourAt],
		peakOurAtH: t[ourAt],
		peakUptakeMmolPerH: our[uptakeAt] * volumeL[uptakeAt],
		peakUptakeAtH: t[uptakeAt],
		peakUptakeOurMmolPerLH: our[uptakeAt],
		peakUptakeVolumeL: volumeL[uptakeAt]
	};
}

/**
 * Rounds a positive requirement up to `digits` significant digits, so that a figure shown to a person
 * and typed back in still meets the requirement (rounding to nearest could fall just short).
 */
export function roundUpToSignificant(value: number, digits = 3): number {
	if (!(value > 0) || !Number.isFinite(value)) return value;
	const scale = 10 ** (digits - 1 - Math.floor(Math.log10(value)));
	let steps = Math.ceil(value * scale);
	// value·scale can land a hair above a whole number (0.274 × 1000 = 274.00000000000006): one step
	// less is still enough when it still meets the value.
	if ((steps - 1) / scale >= value) steps -= 1;
	return steps / scale;
}
