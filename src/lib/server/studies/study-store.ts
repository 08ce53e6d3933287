import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { AIR_O2_MOLE_FRACTION, DEFAULT_SAFETY_FACTOR } from '$chemistry';
import { FEED_PLAN_STRATEGIES, TARGET_BASES } from '$lib/studies';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { organismProfile, recipe, recipeVersion, study, studyFeed, vessel } from '../db/schema';
import { RuleError } from '../rule-error';
import { evaluateStudy } from './evaluate';
import { optionalNumber, optionalText, requiredNumber, requiredText } from './fields';
import { loadStudyInputs } from './queries';

export const FEED_SLOTS = 3;

const feedVersion = z.string().optional().transform((v) => v || null);
const feedSlots = {
	feed1VersionId: feedVersion,
	feed1VolumeL: optionalNumber('Feed 1 volume', { min: 0, unit: 'L' }),
	feed2VersionId: feedVersion,
	feed2VolumeL: optionalNumber('Feed 2 volume', { min: 0, unit: 'L' }),
	feed3VersionId: feedVersion,
	feed3VolumeL: optionalNumber('Feed 3 volume', { min: 0, unit: 'L' })
};

export const studySchema = z.object({
	name: requiredText('Name'),
	basalVersionId: requiredText('Basal recipe version'),
	profileId: requiredText('Organism profile'),
	vesselId: requiredText('Vessel'),
	targetBasis: z.enum(TARGET_BASES, { error: 'Choose g/L or cells/mL' }),
	targetValue: requiredNumber('Target density', { gt: 0 }),
	initialVolumeL: requiredNumber('Initial volume', { gt: 0, unit: 'L' }),
	inoculumDensity: requiredNumber('Inoculum density', { gt: 0 }),
	durationH: requiredNumber('Run duration', { gt: 0, max: 1440, unit: 'h' }),
	feedStrategy: z.enum(FEED_PLAN_STRATEGIES, { error: 'Choose a feeding plan' }),
	feedStartH: requiredNumber('Feed start', { min: 0, unit: 'h' }),
	feedMuSetPerH: optionalNumber('μset of the exponential feed', { gt: 0, max: 3, unit: '1/h' }),
	temperatureC: requiredNumber('Temperature', { min: 0, max: 40, unit: '°C' }),
	pressureKPa: requiredNumber('Headspace pressure (absolute)', { min: 50, max: 1000, unit: 'kPa' }),
	o2MoleFraction: requiredNumber('O2 mole fraction of the inlet gas', { gt: 0, max: 1 }),
	doSetpointPercent: requiredNumber('DO setpoint', { min: 0, max: 99, unit: '% of air saturation' }),
	safetyFactor: requiredNumber('Safety factor', { min: 1, max: 5 }),
	notes: optionalText(),
	...feedSlots
});

export type StudyForm = z.infer<typeof studySchema>;

export const STUDY_FORM_DEFAULTS = {
	targetBasis: 'biomassGPerL',
	feedStrategy: 'exponential',
	feedStartH: '8',
	temperatureC: '37',
	pressureKPa: '101.325',
	o2MoleFraction: String(AIR_O2_MOLE_FRACTION),
	doSetpointPercent: '30',
	safetyFactor: String(DEFAULT_SAFETY_FACTOR)
};

function feedsOfForm(form: StudyForm): { versionId: string; volumeL: number; slot: number }[] {
	const record = form as unknown as Record<string, string | number | null>;
	const feeds: { versionId: string; volumeL: number; slot: number }[] = [];
	for (let i = 1; i <= FEED_SLOTS; i++) {
		const versionId = record[`feed${i}VersionId`] as string | null;
		const volumeL = record[`feed${i}VolumeL`] as number | null;
		if (!versionId && volumeL == null) continue;
		if (!versionId) throw new RuleError('Choose the feed recipe version for this volume, or clear the volume.', { field: `feed${i}VersionId` });
		if (volumeL == null) throw new RuleError('Enter the planned volume of this feed over the run.', { field: `feed${i}VolumeL` });
		feeds.push({ versionId, volumeL, slot: i });
	}
	return feeds;
}

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

function checkReferences(form: StudyForm, feeds: ReturnType<typeof feedsOfForm>, tx: Tx) {
	const kindOf = (versionId: string) =>
		tx.select({ kind: recipe.kind }).from(recipeVersion).innerJoin(recipe, eq(recipeVersion.recipeId, recipe.id)).where(eq(recipeVersion.id, versionId)).get()?.kind;
	const basalKind = kindOf(form.basalVersionId);
	if (!basalKind) throw new RuleError('Choose a basal recipe version: the one given does not exist.', { field: 'basalVersionId' });
	if (basalKind !== 'basal') throw new RuleError('The basal medium must be a version of a basal recipe.', { field: 'basalVersionId' });
	for (const f of feeds) {
		const kind = kindOf(f.versionId);
		if (!kind) throw new RuleError('That feed recipe version does not exist.', { field: `feed${f.slot}VersionId` });
		if (kind !== 'feed') throw new RuleError('A feed must be a version of a feed recipe.', { field: `feed${f.slot}VersionId` });
	}
	if (!tx.select().from(organismProfile).where(eq(organismProfile.id, form.profileId)).get()) throw new RuleError('Choose an organism profile.', { field: 'profileId' });
	const v = tx.select().from(vessel).where(eq(vessel.id, form.vesselId)).get();
	if (!v) throw new RuleError('Choose a vessel.', { field: 'vesselId' });
	if (form.pressureKPa > v.maxPressureKPa) {
		throw new RuleError(`${form.pressureKPa} kPa is above the vessel's pressure rating of ${v.maxPressureKPa} kPa; stay within it.`, { field: 'pressureKPa' });
	}
	if (form.feedStrategy === 'exponential' && feeds.length > 0 && form.feedMuSetPerH === null) {
		throw new RuleError('An exponential feeding plan needs μset.', { field: 'feedMuSetPerH' });
	}
	if (feeds.length > 0 && form.feedStartH >= form.durationH) throw new RuleError('The feed must start before the end of the run.', { field: 'feedStartH' });
}

const PROFILE_FIELD = /^profile\./;
const VESSEL_FIELD = /^vessel\./;

/** The saved study must evaluate: a target beyond sense or a profile missing data is refused here, with the reason. */
function requireEvaluable(studyId: string, tx: Tx) {
	try {
		evaluateStudy(loadStudyInputs(studyId, tx).inputs);
	} catch (cause) {
		if (!(cause instanceof RuleError)) throw cause;
		const field = cause.field === 'targetValue' ? 'targetValue' : PROFILE_FIELD.test(cause.field ?? '') ? 'profileId' : VESSEL_FIELD.test(cause.field ?? '') ? 'vesselId' : cause.field;
		throw new RuleError(cause.message, { field, status: 400 });
	}
}

function valuesOf(form: StudyForm) {
	const { name, basalVersionId, profileId, vesselId, targetBasis, targetValue, initialVolumeL, inoculumDensity, durationH, feedStrategy, feedStartH, feedMuSetPerH, temperatureC, pressureKPa, o2MoleFraction, doSetpointPercent, safetyFactor, notes } = form;
	return { name, basalVersionId, profileId, vesselId, targetBasis, targetValue, initialVolumeL, inoculumDensity, durationH, feedStrategy, feedStartH, feedMuSetPerH, temperatureC, pressureKPa, o2MoleFraction, doSetpointPercent, safetyFactor, notes };
}

function nameTaken(name: string, exceptId: string | null, tx: Tx) {
	const other = tx.select({ id: study.id }).from(study).where(eq(study.name, name)).get();
	return other && other.id !== exceptId;
}

export function createStudy(actor: Actor & { id: string }, form: StudyForm): string {
	const feeds = feedsOfForm(form);
	return db.transaction((tx) => {
		checkReferences(form, feeds, tx);
		if (nameTaken(form.name, null, tx)) throw new RuleError('A study with this name exists; choose another name.', { field: 'name', status: 409 });
		const id = crypto.randomUUID();
		tx.insert(study).values({ id, ...valuesOf(form), createdById: actor.id }).run();
		feeds.forEach((f, position) => tx.insert(studyFeed).values({ studyId: id, versionId: f.versionId, volumeL: f.volumeL, position }).run());
		requireEvaluable(id, tx);
		recordAudit(actor, { action: 'study.created', subjectType: 'study', subjectId: id, detail: { name: form.name } }, tx);
		return id;
	});
}

export function updateStudy(actor: Actor, id: string, revision: number, form: StudyForm): void {
	const feeds = feedsOfForm(form);
	db.transaction((tx) => {
		const current = tx.select().from(study).where(eq(study.id, id)).get();
		if (!current) throw new RuleError('No such study.', { status: 404 });
		if (current.revision !== revision) throw new RuleError('Someone else saved this study while you were editing it. Reload to see their changes.', { status: 409 });
		checkReferences(form, feeds, tx);
		if (nameTaken(form.name, id, tx)) throw new RuleError('A study with this name exists; choose another name.', { field: 'name', status: 409 });
		tx.update(study).set({ ...valuesOf(form), revision: revision + 1, updatedAt: new Date() }).where(eq(study.id, id)).run();
		tx.delete(studyFeed).where(eq(studyFeed.studyId, id)).run();
		feeds.forEach((f, position) => tx.insert(studyFeed).values({ studyId: id, versionId: f.versionId, volumeL: f.volumeL, position }).run());
		requireEvaluable(id, tx);
		recordAudit(actor, { action: 'study.updated', subjectType: 'study', subjectId: id, detail: { name: form.name } }, tx);
	});
}

export function deleteStudy(actor: Actor, id: string): void {
	db.transaction((tx) => {
		const current = tx.select().from(study).where(eq(study.id, id)).get();
		if (!current) throw new RuleError('No such study.', { status: 404 });
		tx.delete(studyFeed).where(eq(studyFeed.studyId, id)).run();
		tx.delete(study).where(eq(study.id, id)).run();
		recordAudit(actor, { action: 'study.deleted', subjectType: 'study', subjectId: id, detail: { name: current.name } }, tx);
	});
}

/** The form text of a saved study, to refill the edit form. */
export function studyFormValues(id: string): Record<string, string> | undefined {
	const row = db.select().from(study).where(eq(study.id, id)).get();
	if (!row) return undefined;
	const feeds = db.select().from(studyFeed).where(eq(studyFeed.studyId, id)).all().sort((a, b) => a.position - b.position);
	const values: Record<string, string> = {};
	for (const [k, v] of Object.entries(valuesOf(row as unknown as StudyForm))) values[k] = v === null || v === undefined ? '' : String(v);
	feeds.forEach((f, i) => {
		values[`feed${i + 1}VersionId`] = f.versionId;
		values[`feed${i + 1}VolumeL`] = String(f.volumeL);
	});
	values.revision = String(row.revision);
	return values;
}
