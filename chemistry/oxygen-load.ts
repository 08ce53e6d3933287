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

/**
 * The peaks over the series, or over its start up to `untilH` (e.g. when the culture reaches its
 * target), with OUR and V there interpolated linearly between the points around it.
 */
export function findPeakOxygenLoad(series: OxygenLoadSeries, untilH = Infinity): PeakOxygenLoad {
	const { t, ourMmolPerLH: our, volumeL } = series;
	if (t.length === 0 || our.length !== t.length || volumeL.length !== t.length) {
		throw new ChemistryInputError('The series need the same, non-zero number of points.', {
			field: 'ourMmolPerLH'
		});
	}
	const points: { t: number; our: number; v: number }[] = [];
	for (let i = 0; i < t.length && t[i] <= untilH; i++)
		points.push({ t: t[i], our: our[i], v: volumeL[i] });
	const next = points.length;
	if (next > 0 && next < t.length && untilH > t[next - 1]) {
		const f = (untilH - t[next - 1]) / (t[next] - t[next - 1]);
		const between = (a: number, b: number) => a + f * (b - a);
		points.push({
			t: untilH,
			our: between(our[next - 1], our[next]),
			v: between(volumeL[next - 1], volumeL[next])
		});
	}
	if (points.length === 0) points.push({ t: t[0], our: our[0], v: volumeL[0] });
	let ourAt = points[0];
	let uptakeAt = points[0];
	for (const p of points) {
		if (p.our > ourAt.our) ourAt = p;
		if (p.our * p.v > uptakeAt.our * uptakeAt.v) uptakeAt = p;
	}
	return {
		peakOurMmolPerLH: ourAt.our,
		peakOurAtH: ourAt.t,
		peakUptakeMmolPerH: uptakeAt.our * uptakeAt.v,
		peakUptakeAtH: uptakeAt.t,
		peakUptakeOurMmolPerLH: uptakeAt.our,
		peakUptakeVolumeL: uptakeAt.v
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
