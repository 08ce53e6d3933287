/**
 * Readers for the numbers a caller hands the science. Each returns the number it was given or throws a
 * ChemistryInputError naming the field; the wording is shared so that the same check reads the same
 * in every module. `label` is how the message names the value (a field path by default).
 */
import { ChemistryInputError } from './errors';
import { fieldLabel } from './field-labels';

export interface Bounds {
	/** value must be > min (exclusive) or ≥ min (inclusive) */
	min?: number;
	minInclusive?: boolean;
	max?: number;
	maxInclusive?: boolean;
}

export const POSITIVE: Bounds = { min: 0 };
export const NON_NEGATIVE: Bounds = { min: 0, minInclusive: true };

function describeBounds(b: Bounds): string {
	const parts: string[] = [];
	if (b.min !== undefined) parts.push(`${b.minInclusive ? 'at least' : 'greater than'} ${b.min}`);
	if (b.max !== undefined) parts.push(`${b.maxInclusive ? 'at most' : 'less than'} ${b.max}`);
	return parts.length ? ` ${parts.join(' and ')}` : '';
}

export function isWithin(value: unknown, bounds: Bounds): value is number {
	if (typeof value !== 'number' || !Number.isFinite(value)) return false;
	const { min, max, minInclusive = false, maxInclusive = false } = bounds;
	const tooLow = min !== undefined && (minInclusive ? value < min : value <= min);
	const tooHigh = max !== undefined && (maxInclusive ? value > max : value >= max);
	return !tooLow && !tooHigh;
}

/** The refusal of `value` at `field`: not a finite number, or outside `bounds`. */
export function numberMessage(field: string, value: unknown, bounds: Bounds): string {
	const label = fieldLabel(field);
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		return `${label} must be a finite number${describeBounds(bounds)}.`;
	}
	return `${label} must be${describeBounds(bounds)} (got ${value}).`;
}

/** A finite number within `bounds`: "field must be a finite number greater than 0." and the like. */
export function readNumber(value: unknown, field: string, bounds: Bounds = {}): number {
	if (!isWithin(value, bounds)) {
		throw new ChemistryInputError(numberMessage(field, value, bounds), { field });
	}
	return value;
}

/** As readNumber, with `fallback` for a value left out (undefined or null). */
export function readOptional(
	value: unknown,
	field: string,
	fallback: number,
	bounds: Bounds = {}
): number {
	return value === undefined || value === null ? fallback : readNumber(value, field, bounds);
}

export function isGiven(value: unknown): boolean {
	return value !== undefined && value !== null;
}

/** A finite number: "label must be a finite number". */
export function readFinite(
	value: unknown,
	field: string,
	label: string = fieldLabel(field)
): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new ChemistryInputError(`${label} must be a finite number`, { field });
	}
	return value;
}

/** A finite number ≥ 0: "label must not be negative, not −1". */
export function readNonNegative(
	value: unknown,
	field: string,
	label: string = fieldLabel(field)
): number {
	const v = readFinite(value, field, label);
	if (v < 0) throw new ChemistryInputError(`${label} must not be negative, not ${v}`, { field });
	return v;
}

/** A finite number > 0: "label must be greater than 0, not 0". */
export function readPositive(
	value: unknown,
	field: string,
	label: string = fieldLabel(field)
): number {
	const v = readFinite(value, field, label);
	if (v <= 0) throw new ChemistryInputError(`${label} must be greater than 0, not ${v}`, { field });
	return v;
}

/** A finite number from `min` to `max`, both included: "label must be a number from 0 to 100". */
export function readBetween(
	value: unknown,
	field: string,
	min: number,
	max: number,
	label: string = fieldLabel(field)
): number {
	if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
		throw new ChemistryInputError(`${label} must be a number from ${min} to ${max}`, { field });
	}
	return value;
}

/** A whole number from `min` to `max`: "label must be a whole number from 2 to 10000.". */
export function readWholeNumber(
	value: unknown,
	field: string,
	min: number,
	max: number,
	label: string = fieldLabel(field)
): number {
	if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
		throw new ChemistryInputError(`${label} must be a whole number from ${min} to ${max}.`, {
			field
		});
	}
	return value;
}

/** A molar mass: "Molar mass must be a positive number of g/mol". */
export function readMolarMass(value: unknown, field: string): number {
	if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
		throw new ChemistryInputError('Molar mass must be a positive number of g/mol', { field });
	}
	return value;
}

/** A field path under `prefix` ("oxygen.kLaPerH"), or the field alone when there is no prefix. */
export function joinField(prefix: string, field: string): string {
	return prefix ? `${prefix}.${field}` : field;
}
