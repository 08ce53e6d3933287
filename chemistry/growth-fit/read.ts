// Reading the run data of a growth fit: every refusal names its field.
import { ChemistryInputError } from '../errors';
import { fieldLabel } from '../field-labels';
import { readWholeNumber } from '../input';

/** Most points accepted in one series. */
export const MAX_SERIES_POINTS = 5000;

/** The refusal of a minimum R² outside (0, 1). */
export const minRSquaredMessage = (field = 'minRSquared') =>
	`${fieldLabel(field)} must be between 0 and 1.`;

export function readSeries(values: unknown, field: string, length: number | null): number[] {
	if (!Array.isArray(values))
		throw new ChemistryInputError(`${fieldLabel(field)} must be a list of numbers.`, {
			field
		});
	if (length !== null && values.length !== length) {
		throw new ChemistryInputError(
			`${fieldLabel(field)} has ${values.length} values but Time has ${length}.`,
			{
				field
			}
		);
	}
	values.forEach((v, i) => {
		if (typeof v !== 'number' || !Number.isFinite(v)) {
			throw new ChemistryInputError(
				`${fieldLabel(field)}, value ${i + 1}, must be a finite number.`,
				{
					field: `${field}.${i}`
				}
			);
		}
	});
	return values as number[];
}

export function readTimes(values: unknown, minPoints: number): number[] {
	const t = readSeries(values, 'timeH', null);
	if (t.length < minPoints) {
		throw new ChemistryInputError(
			`At least ${minPoints} data points are needed (got ${t.length}).`,
			{ field: 'timeH' }
		);
	}
	if (t.length > MAX_SERIES_POINTS) {
		throw new ChemistryInputError(
			`At most ${MAX_SERIES_POINTS} data points are accepted (got ${t.length}).`,
			{ field: 'timeH' }
		);
	}
	for (let i = 1; i < t.length; i++) {
		if (!(t[i] > t[i - 1])) {
			throw new ChemistryInputError(
				`timeH must increase strictly; timeH[${i}] = ${t[i]} follows ${t[i - 1]}.`,
				{ field: `timeH.${i}` }
			);
		}
	}
	return t;
}

export function readBiomass(values: unknown, length: number): number[] {
	const x = readSeries(values, 'biomassGPerL', length);
	x.forEach((v, i) => {
		if (v <= 0) {
			throw new ChemistryInputError(
				`biomassGPerL[${i}] is ${v}; biomass must be above 0 to take its logarithm.`,
				{ field: `biomassGPerL.${i}` }
			);
		}
	});
	return x;
}

export function readSubstrate(values: unknown, length: number): number[] {
	const s = readSeries(values, 'substrateGPerL', length);
	s.forEach((v, i) => {
		if (v < 0) {
			throw new ChemistryInputError(
				`substrateGPerL[${i}] is ${v}; a concentration cannot be negative.`,
				{ field: `substrateGPerL.${i}` }
			);
		}
	});
	return s;
}

export function readCurvePoints(value: number | undefined): number {
	return readWholeNumber(value ?? 200, 'curvePoints', 2, 10_000);
}
