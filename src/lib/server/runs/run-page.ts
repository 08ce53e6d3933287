// What the run page shows besides its data: the run, its plan, vessel and organism, the batches it
// used with the lots in each (raw lot → batch → run), and its uploads.
import { asc, desc, eq, inArray } from 'drizzle-orm';
import { db } from '../db';
import {
	batch,
	batchLine,
	lot,
	organismProfile,
	recipe,
	run,
	runBatch,
	runUpload,
	study,
	user,
	vessel
} from '../db/schema';
import { RuleError } from '../rule-error';

export function loadRunPage(runId: string) {
	const found = db
		.select({
			run,
			studyName: study.name,
			vesselName: vessel.name,
			profileName: organismProfile.name,
			profileRevision: organismProfile.revision,
			createdByName: user.name
		})
		.from(run)
		.innerJoin(study, eq(run.studyId, study.id))
		.innerJoin(vessel, eq(run.vesselId, vessel.id))
		.innerJoin(organismProfile, eq(run.profileId, organismProfile.id))
		.innerJoin(user, eq(run.createdById, user.id))
		.where(eq(run.id, runId))
		.get();
	if (!found) throw new RuleError('No such run.', { status: 404 });
	const batches = db
		.select({
			batchId: batch.id,
			number: batch.number,
			state: batch.state,
			recipeName: recipe.name,
			role: runBatch.role,
			addedAt: runBatch.addedAt
		})
		.from(runBatch)
		.innerJoin(batch, eq(runBatch.batchId, batch.id))
		.innerJoin(recipe, eq(batch.recipeId, recipe.id))
		.where(eq(runBatch.runId, runId))
		.orderBy(asc(runBatch.addedAt))
		.all();
	const lots = batches.length
		? db
				.selectDistinct({ batchId: batchLine.batchId, lotId: lot.id, code: lot.code })
				.from(batchLine)
				.innerJoin(lot, eq(batchLine.lotId, lot.id))
				.where(
					inArray(
						batchLine.batchId,
						batches.map((b) => b.batchId)
					)
				)
				.orderBy(asc(lot.code))
				.all()
		: [];
	const uploads = db
		.select({
			id: runUpload.id,
			source: runUpload.source,
			fileName: runUpload.fileName,
			rowCount: runUpload.rowCount,
			pointCount: runUpload.pointCount,
			unchangedCount: runUpload.unchangedCount,
			replacedCount: runUpload.replacedCount,
			createdAt: runUpload.createdAt,
			byName: user.name
		})
		.from(runUpload)
		.innerJoin(user, eq(runUpload.createdById, user.id))
		.where(eq(runUpload.runId, runId))
		.orderBy(desc(runUpload.createdAt))
		.limit(20)
		.all();
	return {
		...found,
		batches: batches.map((b) => ({
			...b,
			lots: lots.filter((l) => l.batchId === b.batchId).map((l) => ({ id: l.lotId, code: l.code }))
		})),
		uploads
	};
}

/** The released batches to pick from when linking, newest first (a scan finds any other). */
export function releasedBatchChoices(limit = 100) {
	return db
		.select({ number: batch.number, recipeName: recipe.name })
		.from(batch)
		.innerJoin(recipe, eq(batch.recipeId, recipe.id))
		.where(eq(batch.state, 'released'))
		.orderBy(desc(batch.plannedOn), desc(batch.number))
		.limit(limit)
		.all();
}
