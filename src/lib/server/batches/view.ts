import { asc, eq } from 'drizzle-orm';
import { isoToday } from '$lib/inventory';
import { config } from '../config';
import { db } from '../db';
import { batchDeviation, recipe, recipeVersion, user } from '../db/schema';
import { lotsUsedByBatch } from '../inventory/where-used';
import { analyseVersion } from '../recipes/analysis';
import { findRecipe, findVersionById, personName } from '../recipes/queries';
import { RuleError } from '../rule-error';
import { signaturesFor } from '../signatures';
import { completionProblem } from './completion';
import { requireBatch } from './execution';
import { buildSheetLines, phRange } from './sheet';

export function batchRecordUrl(batchId: string): string {
	return `${config.origin}/batches/${batchId}`;
}

/** Hot solutions scald: common practice flags preparation above 40 °C. */
const HOT_PREPARATION_C = 40;

export interface Caution {
	code: string;
	text: string;
	components: string[];
}

/** The cautions on a sheet: the components' GHS statements, and a hot-solution warning when it applies. */
export function sheetCautions(version: {
	id: string;
	recipeId: string;
	preparationTemperatureC: number;
	osmolalityMinMOsmPerKg: number | null;
	osmolalityMaxMOsmPerKg: number | null;
	instructions: string;
}): Caution[] {
	const cautions: Caution[] = [];
	try {
		cautions.push(
			...analyseVersion(version).hazards.map((h) => ({
				code: h.code,
				text: h.text,
				components: h.components
			}))
		);
	} catch (cause) {
		if (!(cause instanceof RuleError)) throw cause;
	}
	if (
		version.preparationTemperatureC > HOT_PREPARATION_C ||
		/autoclav|hot|warm/i.test(version.instructions)
	) {
		cautions.push({
			code: 'HOT',
			text: 'Hot solution or autoclaved medium: risk of scalds; let it cool and use heat-resistant gloves.',
			components: []
		});
	}
	return cautions;
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
		cautions: sheetCautions(version),
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
