// Binding a zod schema to the TypeScript type it documents, so the two cannot drift apart. Generic:
// the science's request and response schemas use it, and so do the app's other response schemas.
import { z } from 'zod';

/**
 * What JSON.stringify makes of T, which is what a client reads: a Date becomes its ISO text; arrays,
 * tuples and objects keep their shape, field by field.
 */
export type Wire<T> = T extends Date
	? string
	: T extends object
		? { [K in keyof T]: Wire<T[K]> }
		: T;

/** A Date as its handler's JSON carries it (`Date.prototype.toJSON`). */
export const isoTime = () => z.iso.datetime().describe('ISO 8601 date and time, UTC');

/** `true` when A and B accept the same values (each is assignable to the other). */
type SameShape<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;

/** The named keys of T: a `.loose()` schema's output also has an index signature, which says nothing. */
type KnownKeys<T> = { [K in keyof T as string extends K ? never : K]: T[K] };

/** What the type check reports when a response schema and the type it documents drift apart. */
interface ShapeMismatch<Schema, Type> {
	'the response schema and the type its handler returns differ': { schema: Schema; type: Type };
}

/**
 * A response schema bound, at compile time, to the type its handler returns (as JSON: `Wire<T>`):
 * the type check fails when a field is added, renamed or retyped on one side only. Usage:
 * `export const analysisResponse = describes<RecipeAnalysis>()(z.object({ ... }))`.
 */
export function describes<T>() {
	return <S extends z.ZodType>(
		schema: S &
			(SameShape<z.output<S>, Wire<T>> extends true ? unknown : ShapeMismatch<z.output<S>, Wire<T>>)
	): S => schema;
}

/**
 * For a schema that documents part of a larger answer (`.loose()`): every value of T must fit it,
 * so a documented field renamed or retyped in T fails the type check.
 */
export function documentsPartOf<T>() {
	return <S extends z.ZodType>(
		schema: S &
			([Wire<T>] extends [KnownKeys<z.output<S>>] ? unknown : ShapeMismatch<z.output<S>, Wire<T>>)
	): S => schema;
}
