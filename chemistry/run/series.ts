// Small helpers over time series given as parallel arrays of times and values.

export interface TimeSeries {
	timeH: number[];
	value: number[];
}

/**
 * The value at `t` by straight-line interpolation between the neighbouring points; the end values
 * outside them; null for an empty series. Times must rise.
 */
export function interpolateAt(series: TimeSeries, t: number): number | null {
	const { timeH, value } = series;
	const n = timeH.length;
	if (n === 0) return null;
	if (t <= timeH[0]) return value[0];
	if (t >= timeH[n - 1]) return value[n - 1];
	let lo = 0;
	let hi = n - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (timeH[mid] <= t) lo = mid;
		else hi = mid;
	}
	const f = (t - timeH[lo]) / (timeH[hi] - timeH[lo]);
	return value[lo] + f * (value[hi] - value[lo]);
}

/** The first time the series stays below `threshold` for at least `holdH` (so one noisy dip is not an event). */
export function firstSustainedBelow(
	series: TimeSeries,
	threshold: number,
	holdH: number
): number | null {
	let since: number | null = null;
	for (let i = 0; i < series.timeH.length; i++) {
		if (series.value[i] < threshold) {
			since ??= series.timeH[i];
			if (series.timeH[i] - since >= holdH) return since;
		} else since = null;
	}
	return null;
}
