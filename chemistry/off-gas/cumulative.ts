/**
 * Totals of O2 consumed and CO2 produced over a run from a series of OUR and CER, with the liquid
 * volume at each point (it may change with feeds and samples): ∫ rate·V dt by the trapezoid rule.
 */
import { ChemistryInputError } from '../errors';
import { readFinite, readPositive } from '../input';

const MMOL_PER_MOL = 1000;

export interface OffGasSeries {
	timeH: readonly number[];
	ourMmolPerLH: readonly number[];
	cerMmolPerLH: readonly number[];
	volumeL: readonly number[];
}

export interface CumulativeGasExchange {
	o2ConsumedMol: number;
	co2ProducedMol: number;
	/** running totals at each point, starting from 0 */
	cumulativeO2Mol: number[];
	cumulativeCo2Mol: number[];
}

const SERIES_LABELS: Record<keyof OffGasSeries, string> = {
	timeH: 'Time',
	ourMmolPerLH: 'OUR',
	cerMmolPerLH: 'CER',
	volumeL: 'Liquid volume'
};

function readSeries(series: OffGasSeries): OffGasSeries {
	const n = series.timeH?.length ?? 0;
	if (n < 2) {
		throw new ChemistryInputError('The off-gas series needs at least 2 points to integrate.', {
			field: 'timeH'
		});
	}
	for (const key of ['ourMmolPerLH', 'cerMmolPerLH', 'volumeL'] as const) {
		if (series[key]?.length !== n) {
			throw new ChemistryInputError(
				`${SERIES_LABELS[key]} has ${series[key]?.length ?? 0} values, but Time has ${n}.`,
				{ field: key }
			);
		}
	}
	const at = (key: keyof OffGasSeries, i: number) => `${SERIES_LABELS[key]}, value ${i + 1}`;
	for (let i = 0; i < n; i++) {
		readFinite(series.timeH[i], `timeH.${i}`, at('timeH', i));
		readFinite(series.ourMmolPerLH[i], `ourMmolPerLH.${i}`, at('ourMmolPerLH', i));
		readFinite(series.cerMmolPerLH[i], `cerMmolPerLH.${i}`, at('cerMmolPerLH', i));
		readPositive(series.volumeL[i], `volumeL.${i}`, at('volumeL', i));
		if (i > 0 && !(series.timeH[i] > series.timeH[i - 1])) {
			throw new ChemistryInputError(
				`${at('timeH', i)} (${series.timeH[i]} h) must be later than the value before it (${series.timeH[i - 1]} h).`,
				{ field: `timeH.${i}` }
			);
		}
	}
	return series;
}

function integrate(timeH: readonly number[], rateMmolPerH: number[]): number[] {
	const totals = [0];
	for (let i = 1; i < timeH.length; i++) {
		const stepMmol = ((rateMmolPerH[i - 1] + rateMmolPerH[i]) / 2) * (timeH[i] - timeH[i - 1]);
		totals.push(totals[i - 1] + stepMmol / MMOL_PER_MOL);
	}
	return totals;
}

/** O2 consumed and CO2 produced, in mol, from OUR·V and CER·V by the trapezoid rule. */
export function integrateGasExchange(series: OffGasSeries): CumulativeGasExchange {
	const { timeH, ourMmolPerLH, cerMmolPerLH, volumeL } = readSeries(series);
	const cumulativeO2Mol = integrate(
		timeH,
		ourMmolPerLH.map((our, i) => our * volumeL[i])
	);
	const cumulativeCo2Mol = integrate(
		timeH,
		cerMmolPerLH.map((cer, i) => cer * volumeL[i])
	);
	return {
		o2ConsumedMol: cumulativeO2Mol[cumulativeO2Mol.length - 1],
		co2ProducedMol: cumulativeCo2Mol[cumulativeCo2Mol.length - 1],
		cumulativeO2Mol,
		cumulativeCo2Mol
	};
}
