import { expect } from 'vitest';
import { auditEventsFor } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { recipe } from '$lib/server/db/schema';
import { findVersion, linesOf } from '$lib/server/recipes/queries';
import { callRoute, type Caller } from './api-write-calls';

// What the recipe write tests share: the routes, a version's ETag as a script reads it, its state.

export const VERSION = '/api/v1/recipes/[id]/versions/[n]';
export const LINES = `${VERSION}/lines`;
export const SUBMIT = `${VERSION}/submit`;
export const at = (id: string, n = 1) => ({ id, n: String(n) });
export const unique = () => crypto.randomUUID().slice(0, 8);

/** The ETag GET answers for a version, as a script reads it before an update. */
export async function etagOf(user: Caller, recipeId: string, n = 1): Promise<string> {
	const response = await callRoute('GET', VERSION, { user, params: at(recipeId, n) });
	expect(response.status).toBe(200);
	return response.headers.get('etag')!;
}

/** What the version holds now: its revision, status and its lines' amounts. */
export function stateOf(recipeId: string, n = 1) {
	const version = findVersion(recipeId, n)!;
	return {
		revision: version.revision,
		status: version.status,
		amounts: linesOf(version.id).map((l) => l.amount)
	};
}

export const lastAudit = (subjectType: string, id: string) => auditEventsFor(subjectType, id, 1)[0];

export function recipeName(id: string): string {
	return db
		.select()
		.from(recipe)
		.all()
		.find((r) => r.id === id)!.name;
}
