import type { z } from 'zod';

/** `true` when A and B accept the same values (each is assignable to the other). */
type SameShape<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;

/** The named keys of T: a `.loose()` schema's output also has an index signature, which says nothing. */
type KnownKeys<T> = { [K in keyof T as string extends K ? never : K]: T[K] };

/** What the type check reports when a response schema and the type it documents drift apart. */
interface ShapeMismatch<Schema, Type> {
	'the response schema and the type its handler returns differ': { schema: Schema; type: Type };
}

/**
 * A response schema bound, at compile time, to the type its handler returns: the type check fails
 * when a field is added, renamed or retyped on one side only. Usage:
 * `export const analysisResponse = describes<RecipeAnalysis>()(z.object({ ... }))`.
 */
export function describes<T>() {
	return <S extends z.ZodType>(
		schema: S & (SameShape<z.output<S>, T> extends true ? unknown : ShapeMismatch<z.output<S>, T>)
	): S => schema;
}

/**
 * For a schema that documents part of a larger answer (`.loose()`): every value of T must fit it,
 * so a documented field renamed or retyped in T fails the type check.
 */
export function documentsPartOf<T>() {
	return <S extends z.ZodType>(
		schema: S & ([T] extends [KnownKeys<z.output<S>>] ? unknown : ShapeMismatch<z.output<S>, T>)
	): S => schema;
}
