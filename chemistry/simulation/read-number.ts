// Readers for the request's numbers: every refusal names its field and the range it needs.
import { ChemistryInputError } from '../errors';

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

export function readNumber(value: unknown, field: string, bounds: Bounds = {}): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new ChemistryInputError(`${field} must be a finite number${describeBounds(bounds)}.`, {
			field
		});
	}
	const { min, max, minInclusive = false, maxInclusive = false } = bounds;
	const tooLow = min !== undefined && (minInclusive ? value < min : value <= min);
	const tooHigh = max !== undefined && (maxInclusive ? value > max : value >= max);
	if (tooLow || tooHigh) {
		throw new ChemistryInputError(`${field} must be${describeBounds(bounds)} (got ${value}).`, {
			field
		});
	}
	return value;
}

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
