import { convertVolume } from '$lib/quantities';
import { readDecimalText } from '$lib/number-reading';
import { eq } from 'drizzle-orm';
import { DEFAULT_TOLERANCE_PERCENT } from '$lib/recipes';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { sqliteRefusal } from '../db/errors';
import { batch, batchLine, recipe, type Batch } from '../db/schema';
import type { FieldErrors } from '../forms';
import { currentApprovedVersion, findVersionById, linesOf } from '../recipes/queries';
import { RuleError } from '../rule-error';
import { nextBatchNumber } from './numbering';

export interface BatchInput {
	recipeId?: string;
	/** A specific version; it must be approved. Omitted: the recipe's current approved version. */
	versionId?: string;
	targetVolumeL: string | number;
	plannedOn: string;
	intendedUse: string;
}

export const MAX_BATCH_VOLUME_L = 20_000;

/** Checks the inputs of a new batch; every problem is reported against its field. */
export function checkBatchInput(input: BatchInput):
	| {
			ok: true;
			value: {
				versionId: string;
				recipeId: string;
				targetVolumeMl: number;
				plannedOn: string;
				intendedUse: string;
			};
	  }
	| { ok: false; fieldErrors: FieldErrors } {
	const errors: FieldErrors = {};
	let version = input.versionId ? findVersionById(input.versionId) : undefined;
	if (input.versionId && !version) errors.versionId = ['No recipe version with this id.'];
	if (!input.versionId) {
		if (!input.recipeId) errors.recipeId = ['Choose the recipe.'];
		else {
			const found = db.select().from(recipe).where(eq(recipe.id, input.recipeId)).get();
			if (!found) errors.recipeId = ['No recipe with this id.'];
			else {
				version = currentApprovedVersion(found.id);
				if (!version)
					errors.recipeId = [
						`${found.name} has no approved version; only approved versions can be made.`
					];
			}
		}
	} else if (version && version.status !== 'approved') {
		errors.versionId = [
			`Version ${version.n} is ${version.status.replace('_', ' ')}; only an approved version can be made.`
		];
	}
	if (version && input.recipeId && version.recipeId !== input.recipeId)
		errors.versionId = ['This version belongs to another recipe.'];

	const volumeText = String(input.targetVolumeL ?? '').trim();
	const volumeRead = readDecimalText(volumeText, 'Target volume');
	const volumeL = volumeRead.ok ? volumeRead.value : NaN;
	if (!volumeText) errors.targetVolumeL = ['Enter the target volume in litres.'];
	else if (!volumeRead.ok) errors.targetVolumeL = [volumeRead.message];
	else if (volumeL <= 0)
		errors.targetVolumeL = [`“${input.targetVolumeL}” is not a volume above zero (litres).`];
	else if (volumeL > MAX_BATCH_VOLUME_L)
		errors.targetVolumeL = [`At most ${MAX_BATCH_VOLUME_L} L.`];
	else if (Math.round(convertVolume(volumeL, 'L', 'mL')) < 1)
		errors.targetVolumeL = ['At least 1 mL.'];

	const plannedOn = String(input.plannedOn ?? '').trim();
	const date = new Date(`${plannedOn}T00:00:00Z`);
	if (
		!/^\d{4}-\d{2}-\d{2}$/.test(plannedOn) ||
		Number.isNaN(date.getTime()) ||
		date.toISOString().slice(0, 10) !== plannedOn
	) {
		errors.plannedOn = [
			plannedOn
				? `“${plannedOn}” is not a date; write it as YYYY-MM-DD.`
				: 'Enter the planned date.'
		];
	}
	const intendedUse = String(input.intendedUse ?? '').trim();
	if (!intendedUse) errors.intendedUse = ['Say what the batch is for: the vessel or run.'];
	else if (intendedUse.length > 200) errors.intendedUse = ['At most 200 characters.'];

	if (Object.keys(errors).length || !version) return { ok: false, fieldErrors: errors };
	return {
		ok: true,
		value: {
			versionId: version.id,
			recipeId: version.recipeId,
			targetVolumeMl: Math.round(convertVolume(volumeL, 'L', 'mL')),
			plannedOn,
			intendedUse
		}
	};
}

/** Plans a batch: its number and one line per recipe line, in the order of addition. */
export function createBatch(
	actor: Actor & { id: string },
	value: {
		versionId: string;
		recipeId: string;
		targetVolumeMl: number;
		plannedOn: string;
		intendedUse: string;
	},
	now = new Date()
): Batch {
	try {
		return db.transaction((tx) => {
			const version = findVersionById(value.versionId, tx);
			if (!version || version.status !== 'approved')
				throw new RuleError('Only an approved recipe version can be made.', {
					field: 'versionId',
					status: 409
				});
			const lines = linesOf(version.id, tx);
			if (lines.length === 0)
				throw new RuleError('This version has no lines to make.', { field: 'versionId' });
			const numbered = nextBatchNumber(tx, now);
			const row = tx
				.insert(batch)
				.values({
					number: numbered.number,
					numberYear: numbered.year,
					numberSeq: numbered.seq,
					recipeId: version.recipeId,
					versionId: version.id,
					targetVolumeMl: value.targetVolumeMl,
					plannedOn: value.plannedOn,
					intendedUse: value.intendedUse,
					createdById: actor.id
				})
				.returning()
				.get();
			for (const line of lines) {
				tx.insert(batchLine)
					.values({
						batchId: row.id,
						position: line.position,
						kind: line.kind,
						recipeLineId: line.id,
						componentId: line.kind === 'component' ? (line.shelfFormId ?? line.componentId) : null,
						stockRecipeId: line.stockRecipeId,
						tolerancePercent: line.tolerancePercent ?? DEFAULT_TOLERANCE_PERCENT
					})
					.run();
			}
			recordAudit(
				actor,
				{
					action: 'batch.planned',
					subjectType: 'batch',
					subjectId: row.id,
					detail: { number: row.number, versionId: version.id, volumeMl: value.targetVolumeMl }
				},
				tx
			);
			return row;
		});
	} catch (cause) {
		if (sqliteRefusal(cause, /UNIQUE.*batch\.number/)) {
			throw new RuleError(
				'The batch number the pattern gives is already used (was the pattern changed this year?). Ask the administrator to adjust the pattern.',
				{ status: 409 }
			);
		}
		throw cause;
	}
}
