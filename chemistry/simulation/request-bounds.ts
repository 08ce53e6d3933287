// Limits and ranges of the simulation request's numbers, with the one refusal wording (the field
// and the range it needs) used by the schema's field checks and by its cross-field rules alike.
import { z } from 'zod';
import { numberMessage, POSITIVE, type Bounds } from '../input';

/** Longest run accepted: 60 days. */
export const MAX_END_H = 1440;
/** Most output points accepted in one result. */
export const MAX_OUTPUT_POINTS = 50_000;
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

/** JSON cannot carry NaN or Infinity: a value of another type gets the API's short word. */
const typeError = (bounds: Bounds) => (issue: { input?: unknown; path?: PropertyKey[] }) =>
	typeof issue.input === 'number'
		? numberMessage(fieldOf(issue.path), issue.input, bounds)
		: 'Give a number.';

/** A number whose range the cross-field rules check (it depends on the mode or strategy). */
export const givenNumber = z.number({ error: typeError({}) });

/** A number with its range; the range also reaches the OpenAPI document. */
export function boundedNumber(bounds: Bounds): z.ZodNumber {
	const error = (issue: { input?: unknown; path?: PropertyKey[] }) =>
		numberMessage(fieldOf(issue.path), issue.input, bounds);
	let schema = z.number({ error: typeError(bounds) });
	const { min, max, minInclusive = false, maxInclusive = false } = bounds;
	if (min !== undefined)
		schema = minInclusive ? schema.gte(min, { error }) : schema.gt(min, { error });
	if (max !== undefined)
		schema = maxInclusive ? schema.lte(max, { error }) : schema.lt(max, { error });
	return schema;
}

/** Ranges that the cross-field rules read as well as the fields themselves. */
export const MU_MAX_BOUNDS: Bounds = { ...POSITIVE, max: 50 };
export const YIELD_BOUNDS: Bounds = { ...POSITIVE, max: 10 };
export const END_H_BOUNDS: Bounds = { min: 0, max: MAX_END_H, maxInclusive: true };
export const SATURATION_BOUNDS: Bounds = { ...POSITIVE, max: 1000 };
export const DILUTION_BOUNDS: Bounds = { ...POSITIVE, max: 100 };
