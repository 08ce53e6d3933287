import { eq } from 'drizzle-orm';
import { changesBetween, recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { organismProfile, recipe, recipeVersion, study, studyFeed, vessel } from '../db/schema';
import { RuleError } from '../rule-error';
import { evaluateStudy } from './evaluate';
import { loadStudyInputs } from './queries';
import { feedsOfForm, studyFieldsOf, type StudyForm } from './study-form';
import type { StudyInputs } from './types';

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

function checkReferences(form: StudyForm, feeds: ReturnType<typeof feedsOfForm>, tx: Tx) {
	const kindOf = (versionId: string) =>
		tx
			.select({ kind: recipe.kind })
			.from(recipeVersion)
			.innerJoin(recipe, eq(recipeVersion.recipeId, recipe.id))
			.where(eq(recipeVersion.id, versionId))
			.get()?.kind;
	const basalKind = kindOf(form.basalVersionId);
	if (!basalKind)
		throw new RuleError('Choose a basal recipe version: the one given does not exist.', {
			field: 'basalVersionId'
		});
	if (basalKind !== 'basal')
		throw new RuleError('The basal medium must be a version of a basal recipe.', {
			field: 'basalVersionId'
		});
	for (const f of feeds) {
		const kind = kindOf(f.versionId);
		if (!kind)
			throw new RuleError('That feed recipe version does not exist.', {
				field: `feed${f.slot}VersionId`
			});
		if (kind !== 'feed')
			throw new RuleError('A feed must be a version of a feed recipe.', {
				field: `feed${f.slot}VersionId`
			});
	}
	if (!tx.select().from(organismProfile).where(eq(organismProfile.id, form.profileId)).get())
		throw new RuleError('Choose an organism profile.', { field: 'profileId' });
	const v = tx.select().from(vessel).where(eq(vessel.id, form.vesselId)).get();
	if (!v) throw new RuleError('Choose a vessel.', { field: 'vesselId' });
	if (form.pressureKPa > v.maxPressureKPa) {
		throw new RuleError(
			`${form.pressureKPa} kPa is above the vessel's pressure rating of ${v.maxPressureKPa} kPa; stay within it.`,
			{ field: 'pressureKPa' }
		);
	}
}

const PROFILE_FIELD = /^profile\./;
const VESSEL_FIELD = /^vessel\./;

/**
 * The saved study must evaluate: a target beyond sense or a profile missing data is refused here,
 * with the reason. The evaluation runs in the worker pool, so it is made on the inputs the study will
 * have (`inputsOnceWritten`) before the transaction that stores it: a better-sqlite3 transaction
 * cannot wait for a thread. The store then makes its own checks (revision, name, references) again.
 */
async function requireEvaluable(inputs: StudyInputs) {
	try {
		await evaluateStudy(inputs);
	} catch (cause) {
		if (!(cause instanceof RuleError)) throw cause;
		const field =
			cause.field === 'targetValue'
				? 'targetValue'
				: PROFILE_FIELD.test(cause.field ?? '')
					? 'profileId'
					: VESSEL_FIELD.test(cause.field ?? '')
						? 'vesselId'
						: cause.field;
		throw new RuleError(cause.message, { field, status: 400 });
	}
}

const UNDO = Symbol('undo the trial write');

/** The study's inputs once `write` is stored, read in a transaction that is then undone. */
function inputsOnceWritten(studyId: string, write: (tx: Tx) => unknown): StudyInputs {
	let inputs: StudyInputs | undefined;
	try {
		db.transaction((tx) => {
			write(tx);
			inputs = loadStudyInputs(studyId, tx).inputs;
			throw UNDO;
		});
	} catch (cause) {
		if (cause !== UNDO) throw cause;
	}
	return inputs!;
}

function nameTaken(name: string, exceptId: string | null, tx: Tx) {
	const other = tx.select({ id: study.id }).from(study).where(eq(study.name, name)).get();
	return other && other.id !== exceptId;
}

function insertFeeds(studyId: string, feeds: ReturnType<typeof feedsOfForm>, tx: Tx) {
	feeds.forEach(({ slot: _slot, ...plan }, position) =>
		tx
			.insert(studyFeed)
			.values({ studyId, position, ...plan })
			.run()
	);
}

export async function createStudy(actor: Actor & { id: string }, form: StudyForm): Promise<string> {
	const feeds = feedsOfForm(form);
	const id = crypto.randomUUID();
	const write = (tx: Tx) => {
		checkReferences(form, feeds, tx);
		if (nameTaken(form.name, null, tx))
			throw new RuleError('A study with this name exists; choose another name.', {
				field: 'name',
				status: 409
			});
		tx.insert(study)
			.values({ id, ...studyFieldsOf(form), createdById: actor.id })
			.run();
		insertFeeds(id, feeds, tx);
	};
	await requireEvaluable(inputsOnceWritten(id, write));
	db.transaction((tx) => {
		write(tx);
		recordAudit(
			actor,
			{ action: 'study.created', subjectType: 'study', subjectId: id, detail: { name: form.name } },
			tx
		);
	});
	return id;
}

export async function updateStudy(
	actor: Actor,
	id: string,
	revision: number,
	form: StudyForm
): Promise<void> {
	const feeds = feedsOfForm(form);
	const write = (tx: Tx) => {
		const current = tx.select().from(study).where(eq(study.id, id)).get();
		if (!current) throw new RuleError('No such study.', { status: 404 });
		if (current.revision !== revision)
			throw new RuleError(
				'Someone else saved this study while you were editing it. Reload to see their changes.',
				{ status: 409 }
			);
		checkReferences(form, feeds, tx);
		if (nameTaken(form.name, id, tx))
			throw new RuleError('A study with this name exists; choose another name.', {
				field: 'name',
				status: 409
			});
		tx.update(study)
			.set({ ...studyFieldsOf(form), revision: revision + 1, updatedAt: new Date() })
			.where(eq(study.id, id))
			.run();
		tx.delete(studyFeed).where(eq(studyFeed.studyId, id)).run();
		insertFeeds(id, feeds, tx);
		return current;
	};
	await requireEvaluable(inputsOnceWritten(id, write));
	db.transaction((tx) => {
		const current = write(tx);
		recordAudit(
			actor,
			{
				action: 'study.updated',
				subjectType: 'study',
				subjectId: id,
				detail: { name: form.name, changes: changesBetween(current, studyFieldsOf(form)) }
			},
			tx
		);
	});
}

export function deleteStudy(actor: Actor, id: string): void {
	db.transaction((tx) => {
		const current = tx.select().from(study).where(eq(study.id, id)).get();
		if (!current) throw new RuleError('No such study.', { status: 404 });
		tx.delete(studyFeed).where(eq(studyFeed.studyId, id)).run();
		tx.delete(study).where(eq(study.id, id)).run();
		recordAudit(
			actor,
			{
				action: 'study.deleted',
				subjectType: 'study',
				subjectId: id,
				detail: { name: current.name }
			},
			tx
		);
	});
}

/** The form text of a saved study, to refill the edit form. */
export function studyFormValues(id: string): Record<string, string> | undefined {
	const row = db.select().from(study).where(eq(study.id, id)).get();
	if (!row) return undefined;
	const feeds = db
		.select()
		.from(studyFeed)
		.where(eq(studyFeed.studyId, id))
		.all()
		.sort((a, b) => a.position - b.position);
	const values: Record<string, string> = {};
	for (const [k, v] of Object.entries(studyFieldsOf(row as unknown as StudyForm)))
		values[k] = v === null || v === undefined ? '' : String(v);
	const text = (v: string | number | null) => (v === null ? '' : String(v));
	feeds.forEach((f, i) => {
		const slot = `feed${i + 1}`;
		values[`${slot}VersionId`] = f.versionId;
		values[`${slot}VolumeL`] = text(f.volumeL);
		values[`${slot}Strategy`] = f.strategy;
		values[`${slot}StartH`] = text(f.startH);
		values[`${slot}MuSetPerH`] = text(f.muSetPerH);
		values[`${slot}SetpointGPerL`] = text(f.setpointGPerL);
		values[`${slot}DoSetpointPercent`] = text(f.doSetpointPercent);
		values[`${slot}MaxRateLPerH`] = text(f.maxRateLPerH);
	});
	values.revision = String(row.revision);
	return values;
}
