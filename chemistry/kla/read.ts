// Reading the DO series of a kLa test: every refusal names its field by label, and its row.
import { ChemistryInputError } from '../errors';
import { fieldLabel } from '../field-labels';
import { readNumber, NON_NEGATIVE } from '../input';
import { MAX_SERIES_POINTS } from '../growth-fit/read';
import type { DissolvedOxygenUnit } from './types';

/** Fewest points a kLa fit accepts: three parameters and enough left over to judge the scatter. */
export const MIN_KLA_POINTS = 6;

/**
 * Highest percent reading accepted. A probe calibrated to 100 % reads around it with noise and drift
 * of a few percent (common practice): 110 % is five standard deviations of 2 % noise above saturation.
 * Well above that the calibration or the unit (mg/L given as percent) is wrong.
 */
export const MAX_PERCENT_SATURATION = 110;

const UNITS: readonly DissolvedOxygenUnit[] = ['percentSaturation', 'mgPerL'];

export function readDissolvedOxygenUnit(value: unknown, field: string): DissolvedOxygenUnit {
	if (value === undefined || value === null) return 'percentSaturation';
	if (!UNITS.includes(value as DissolvedOxygenUnit)) {
		throw new ChemistryInputError(
			`${fieldLabel(field)} must be percent of saturation or mg/L (got ${String(value)}).`,
			{ field }
		);
	}
	return value as DissolvedOxygenUnit;
}

function readList(values: unknown, field: string): unknown[] {
	if (!Array.isArray(values)) {
		throw new ChemistryInputError(`${fieldLabel(field)} must be a list of numbers.`, { field });
	}
	if (values.length > MAX_SERIES_POINTS) {
		throw new ChemistryInputError(
			`${fieldLabel(field)} has ${values.length} values; at most ${MAX_SERIES_POINTS} are accepted.`,
			{ field }
		);
	}
	return values;
}

/** Times in seconds, finite and strictly increasing, at least MIN_KLA_POINTS of them. */
export function readTimesS(values: unknown, field: string): number[] {
	const list = readList(values, field);
	const label = fieldLabel(field);
	if (list.length < MIN_KLA_POINTS) {
		throw new ChemistryInputError(
			`${label} has ${list.length} values; a kLa fit needs at least ${MIN_KLA_POINTS} points.`,
			{ field }
		);
	}
	list.forEach((v, i) => {
		if (typeof v !== 'number' || !Number.isFinite(v)) {
			throw new ChemistryInputError(`${label}, row ${i + 1}, must be a finite number of seconds.`, {
				field: `${field}.${i}`
			});
		}
		const previous = list[i - 1] as number;
		if (i > 0 && !(v > previous)) {
			throw new ChemistryInputError(
				`${label}, row ${i + 1}, is ${v} s, not later than row ${i} (${previous} s): times must increase strictly.`,
				{ field: `${field}.${i}` }
			);
		}
	});
	return list as number[];
}

/** DO readings: as many as the times, finite, not negative, percent readings not above the ceiling. */
export function readDissolvedOxygen(
	values: unknown,
	field: string,
	timeCount: number,
	unit: DissolvedOxygenUnit
): number[] {
	const list = readList(values, field);
	const label = fieldLabel(field);
	if (list.length !== timeCount) {
		throw new ChemistryInputError(
			`${label} has ${list.length} values but the times have ${timeCount}; give one reading per time.`,
			{ field }
		);
	}
	list.forEach((v, i) => {
		if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) {
			throw new ChemistryInputError(
				`${label}, row ${i + 1}, must be a finite number of at least 0 (got ${String(v)}).`,
				{ field: `${field}.${i}` }
			);
		}
		if (unit === 'percentSaturation' && v > MAX_PERCENT_SATURATION) {
			throw new ChemistryInputError(
				`${label}, row ${i + 1}, is ${v} %: above ${MAX_PERCENT_SATURATION} % of saturation is more than probe noise explains; check the calibration or whether the readings are in mg/L.`,
				{ field: `${field}.${i}` }
			);
		}
	});
	return list as number[];
}

/** τp in seconds; null when left out or 0 (the probe taken as instantaneous). */
export function readProbeTimeConstantS(value: unknown, field: string): number | null {
	if (value === undefined || value === null) return null;
	const seconds = readNumber(value, field, NON_NEGATIVE);
	return seconds === 0 ? null : seconds;
}

/** The index of the first time at or after `startS`, leaving at least MIN_KLA_POINTS points. */
export function readStartIndex(value: unknown, field: string, timeS: number[]): number {
	if (value === undefined || value === null) return 0;
	const startS = readNumber(value, field);
	const index = timeS.findIndex((t) => t >= startS);
	const left = index < 0 ? 0 : timeS.length - index;
	if (left < MIN_KLA_POINTS) {
		throw new ChemistryInputError(
			`${fieldLabel(field)} is ${startS} s, which leaves ${left} points after it; a kLa fit needs at least ${MIN_KLA_POINTS}.`,
			{ field }
		);
	}
	return index;
}
