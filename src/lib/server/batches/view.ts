import { asc, eq } from 'drizzle-orm';
import { isoToday } from '$lib/inventory';
import { config } from '../config';
import { db } from '../db';
import { batchDeviation, recipe, recipeVersion, user } from '../db/schema';
import { lotsUsedByBatch } from '../inventory/where-used';
import { findRecipe, findVersionById, personName } from '../recipes/queries';
import { signaturesFor } from '../signatures';
import { completionProblem } from './completion';
import { requireBatch } from './execution';
import { preparationHazards } from './preparation-hazards';
import { buildSheetLines, phRange } from './sheet';

export function batchRecordUrl(batchId: string): string {
	return `${config.origin}/batches/${batchId}`;
}

/** The full batch record: sheet lines, lots, measurements, deviations and signatures. */
export function batchView(batchId: string, today = isoToday()) {
	const b = requireBatch(batchId);
	const version = findVersionById(b.versionId)!;
	const recipeRow = findRecipe(b.recipeId)!;
	const deviations = db
		.select({
			id: batchDeviation.id,
			lineId: batchDeviation.lineId,
			kind: batchDeviation.kind,
			detail: batchDeviation.detail,
			reason: batchDeviation.reason,
			at: batchDeviation.at,
			by: user.name
		})
		.from(batchDeviation)
		.innerJoin(user, eq(batchDeviation.recordedById, user.id))
		.where(eq(batchDeviation.batchId, b.id))
		.orderBy(asc(batchDeviation.at))
		.all();
	const lines = buildSheetLines(b, db, today).map((l) => ({
		...l,
		doneByName: personName(l.doneById)
	}));
	return {
		batch: {
			...b,
			createdByName: personName(b.createdById),
			preparedByName: personName(b.preparedById),
			reviewedByName: personName(b.reviewedById)
		},
		recipe: { id: recipeRow.id, name: recipeRow.name, kind: recipeRow.kind },
		version: {
			id: version.id,
			n: version.n,
			targetPh: version.targetPh,
			phRange: phRange(version.targetPh),
			osmolalityMinMOsmPerKg: version.osmolalityMinMOsmPerKg,
			osmolalityMaxMOsmPerKg: version.osmolalityMaxMOsmPerKg,
			preparationTemperatureC: version.preparationTemperatureC,
			instructions: version.instructions,
			storage: version.storage,
			shelfLifeDays: version.shelfLifeDays
		},
		lines,
		lots: lotsUsedByBatch(b.id),
		deviations,
		signatures: signaturesFor('batch', [b.id]),
		preparation: preparationHazards(version, lines),
		completionProblem:
			b.state === 'in_preparation' || b.state === 'planned' ? completionProblem(b) : null,
		recordUrl: batchRecordUrl(b.id)
	};
}

export type BatchView = ReturnType<typeof batchView>;

/** Approved versions a batch can be made from. */
export function approvedRecipes() {
	return db
		.select({
			recipeId: recipe.id,
			name: recipe.name,
			kind: recipe.kind,
			versionId: recipeVersion.id,
			n: recipeVersion.n
		})
		.from(recipeVersion)
		.innerJoin(recipe, eq(recipeVersion.recipeId, recipe.id))
		.where(eq(recipeVersion.status, 'approved'))
		.orderBy(asc(recipe.name))
		.all();
}
