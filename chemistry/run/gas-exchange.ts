/**
 * OUR, CER and RQ over a run from its logged gas flow and inlet and exhaust composition, by the
 * inert-gas balance of chemistry/off-gas/balance.ts at each logged time; the in situ kLa where DO is
 * logged; and the O2 consumed and CO2 produced to each time.
 */
import { computeOffGasRates } from '../off-gas/balance';
import { integrateGasExchange } from '../off-gas/cumulative';
import { ChemistryInputError } from '../errors';
import { interpolateAt, type TimeSeries } from './series';

/** Air: 20.95 % O2, 0.04 % CO2 by volume (dry; common practice, from memory). */
export const AIR_INLET = { o2Percent: 20.95, co2Percent: 0.04 };

export interface RunGasInput {
	gasFlowLPerMin: TimeSeries;
	exhaustO2Percent: TimeSeries;
	exhaustCo2Percent: TimeSeries;
	/** when not logged: air */
	inletO2Percent?: TimeSeries | null;
	inletCo2Percent?: TimeSeries | null;
	/** broth volume; when not logged, `volumeFallbackL(t)` */
	volumeL?: TimeSeries | null;
	volumeFallbackL: (timeH: number) => number;
	referenceTemperatureC: number;
	referencePressureKPa: number;
	/** DO in % of air saturation and C* (mg/L) at air saturation, for the in situ kLa */
	dissolvedOxygenPercent?: TimeSeries | null;
	airSaturationMgPerL?: number | null;
}

export interface RunGasExchange {
	timeH: number[];
	ourMmolPerLH: number[];
	cerMmolPerLH: number[];
	respiratoryQuotient: (number | null)[];
	/** OUR/(C* − C); null where DO is not logged or at or above saturation */
	inSituKLaPerH: (number | null)[];
	cumulativeO2Mol: number[];
	cumulativeCo2Mol: number[];
	/** logged times left out, with why (the first few) */
	skipped: { timeH: number; reason: string }[];
	skippedCount: number;
}

const O2_MG_PER_MMOL = 31.998;

/** Values of `series` at the given times when they are logged at exactly those times, else interpolated. */
function alignedTo(series: TimeSeries | null | undefined, times: number[]): (number | null)[] {
	if (!series || series.timeH.length === 0) return times.map(() => null);
	const exact = new Map(series.timeH.map((t, i) => [t, series.value[i]]));
	return times.map((t) => exact.get(t) ?? interpolateAt(series, t));
}

export function computeRunGasExchange(input: RunGasInput): RunGasExchange | null {
	// Times at which the exhaust is analysed; the flow and inlet are read there.
	const exhaustCo2 = new Map(
		input.exhaustCo2Percent.timeH.map((t, i) => [t, input.exhaustCo2Percent.value[i]])
	);
	const times: number[] = [];
	const o2Out: number[] = [];
	const co2Out: number[] = [];
	input.exhaustO2Percent.timeH.forEach((t, i) => {
		const co2 = exhaustCo2.get(t);
		if (co2 === undefined) return;
		times.push(t);
		o2Out.push(input.exhaustO2Percent.value[i]);
		co2Out.push(co2);
	});
	if (times.length === 0) return null;
	const flow = alignedTo(input.gasFlowLPerMin, times);
	const o2In = alignedTo(input.inletO2Percent, times);
	const co2In = alignedTo(input.inletCo2Percent, times);
	const volume = alignedTo(input.volumeL, times);
	const dissolved = alignedTo(input.dissolvedOxygenPercent, times);
	const out: RunGasExchange = {
		timeH: [],
		ourMmolPerLH: [],
		cerMmolPerLH: [],
		respiratoryQuotient: [],
		inSituKLaPerH: [],
		cumulativeO2Mol: [],
		cumulativeCo2Mol: [],
		skipped: [],
		skippedCount: 0
	};
	const volumes: number[] = [];
	for (let i = 0; i < times.length; i++) {
		const t = times[i];
		const volumeL = volume[i] ?? input.volumeFallbackL(t);
		const gasFlow = flow[i];
		if (gasFlow === null || !(gasFlow > 0)) {
			out.skippedCount++;
			if (out.skipped.length < 5) out.skipped.push({ timeH: t, reason: 'no gas flow' });
			continue;
		}
		try {
			const rates = computeOffGasRates({
				inletGasFlowLPerMin: gasFlow,
				referenceTemperatureC: input.referenceTemperatureC,
				referencePressureKPa: input.referencePressureKPa,
				inletO2Fraction: (o2In[i] ?? AIR_INLET.o2Percent) / 100,
				inletCo2Fraction: (co2In[i] ?? AIR_INLET.co2Percent) / 100,
				outletO2Fraction: o2Out[i] / 100,
				outletCo2Fraction: co2Out[i] / 100,
				liquidVolumeL: volumeL
			});
			out.timeH.push(t);
			out.ourMmolPerLH.push(rates.ourMmolPerLH);
			out.cerMmolPerLH.push(rates.cerMmolPerLH);
			out.respiratoryQuotient.push(rates.respiratoryQuotient);
			volumes.push(volumeL);
			// C* with the gas in use (Henry's law: in proportion to the inlet O2), C from the probe.
			const doPercent = dissolved[i];
			const airSaturation = input.airSaturationMgPerL ?? null;
			const inletO2 = o2In[i] ?? AIR_INLET.o2Percent;
			const saturationMgPerL =
				airSaturation === null ? null : (airSaturation * inletO2) / AIR_INLET.o2Percent;
			const dissolvedMgPerL =
				airSaturation === null || doPercent === null ? null : (airSaturation * doPercent) / 100;
			out.inSituKLaPerH.push(
				saturationMgPerL !== null &&
					dissolvedMgPerL !== null &&
					dissolvedMgPerL < saturationMgPerL &&
					rates.ourMmolPerLH > 0
					? rates.ourMmolPerLH / ((saturationMgPerL - dissolvedMgPerL) / O2_MG_PER_MMOL)
					: null
			);
		} catch (cause) {
			if (!(cause instanceof ChemistryInputError)) throw cause;
			out.skippedCount++;
			if (out.skipped.length < 5) out.skipped.push({ timeH: t, reason: cause.message });
		}
	}
	if (out.timeH.length >= 2) {
		const totals = integrateGasExchange({
			timeH: out.timeH,
			ourMmolPerLH: out.ourMmolPerLH,
			cerMmolPerLH: out.cerMmolPerLH,
			volumeL: volumes
		});
		out.cumulativeO2Mol = totals.cumulativeO2Mol;
		out.cumulativeCo2Mol = totals.cumulativeCo2Mol;
	} else {
		out.cumulativeO2Mol = out.timeH.map(() => 0);
		out.cumulativeCo2Mol = out.timeH.map(() => 0);
	}
	return out;
}
