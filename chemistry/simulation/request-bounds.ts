// Limits and ranges of the simulation request's numbers, with the one refusal wording (the field
// and the range it needs) used by the schema's field checks and by its cross-field rules alike.
import { z } from 'zod';
import { fieldLabel } from '../field-labels';
import { numberMessage, POSITIVE, type Bounds } from '../input';

/** Longest run accepted: 60 days. */
export const MAX_END_H = 1440;
/** Most output points accepted in one result. */
export const MAX_OUTPUT_POINTS = 50_000;
/** At most this many output intervals when the request leaves the interval to the run. */
export const DEFAULT_OUTPUT_INTERVALS = 2_000;
/** Most draw-fill cycles accepted in one run. */
export const MAX_DRAW_CYCLES = 10_000;
/** Most feed streams accepted in one fed-batch run. */
export const MAX_FEED_STREAMS = 8;
/** Longest feed label accepted, in characters. */
export const MAX_FEED_LABEL_LENGTH = 80;

export { isWithin, NON_NEGATIVE, numberMessage, POSITIVE, type Bounds } from '../input';

/** A request path as the dotted field name users and problem+json see (`feeds.1.rateLPerH`). */
export const fieldOf = (path: readonly PropertyKey[] | undefined): string =>
	(path ?? []).map(String).join('.');

type Issue = { input?: unknown; path?: PropertyKey[] };

/** JSON cannot carry NaN or Infinity: a value of another type gets the API's short word. */
const typeError =
	(bounds: Bounds, missing: (field: string) => string = () => 'Give a number.') =>
	(issue: Issue) =>
		typeof issue.input === 'number'
			? numberMessage(fieldOf(issue.path), issue.input, bounds)
			: issue.input === undefined
				? missing(fieldOf(issue.path))
				: 'Give a number.';

/** A number whose range the cross-field rules check (it depends on the mode or strategy). */
export const givenNumber = z.number({ error: typeError({}) });

/** A number with its range; the range also reaches the OpenAPI document. */
export function boundedNumber(bounds: Bounds, missing?: (field: string) => string): z.ZodNumber {
	const error = (issue: Issue) => numberMessage(fieldOf(issue.path), issue.input, bounds);
	let schema = z.number({ error: typeError(bounds, missing) });
	const { min, max, minInclusive = false, maxInclusive = false } = bounds;
	if (min !== undefined)
		schema = minInclusive ? schema.gte(min, { error }) : schema.gt(min, { error });
	if (max !== undefined)
		schema = maxInclusive ? schema.lte(max, { error }) : schema.lt(max, { error });
	return schema;
}

/** A number the request cannot do without: left out, the refusal names its field. */
export const requiredNumber = (bounds: Bounds): z.ZodNumber =>
	boundedNumber(bounds, (field) => `${fieldLabel(field)} is required.`);

/** A whole number from `min` to `max`, in the wording of the science's `readWholeNumber`. */
export function boundedWholeNumber(min: number, max: number): z.ZodNumber {
	const error = (issue: Issue) =>
		`${fieldLabel(fieldOf(issue.path))} must be a whole number from ${min} to ${max}.`;
	return z.int({ error }).gte(min, { error }).lte(max, { error });
}

/** Ranges that the cross-field rules read as well as the fields themselves. */
export const MU_MAX_BOUNDS: Bounds = { ...POSITIVE, max: 50 };
export const YIELD_BOUNDS: Bounds = { ...POSITIVE, max: 10 };
export const END_H_BOUNDS: Bounds = { min: 0, max: MAX_END_H, maxInclusive: true };
export const SATURATION_BOUNDS: Bounds = { ...POSITIVE, max: 1000 };
export const DILUTION_BOUNDS: Bounds = { ...POSITIVE, max: 100 };
