import { eq } from 'drizzle-orm';
import { z } from 'zod';
import {
	AIR_O2_MOLE_FRACTION,
	DEFAULT_SAFETY_FACTOR,
	HEAT_PER_MOL_O2_RANGE_KJ,
	STUDY_TEMPERATURE_RANGE_C
} from '$chemistry';
import {
	FEED_PLAN_STRATEGIES,
	isControlledPlan,
	TARGET_BASES,
	type FeedPlan,
	type FeedPlanStrategy
} from '$lib/studies';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { organismProfile, recipe, recipeVersion, study, studyFeed, vessel } from '../db/schema';
import { RuleError } from '../rule-error';
import { evaluateStudy } from './evaluate';
import { optionalNumber, optionalText, requiredNumber, requiredText } from './fields';
import { loadStudyInputs } from './queries';

export const FEED_SLOTS = 3;

/** The form fields of one feed slot, `feed<N><Field>`. */
export const FEED_SLOT_FIELDS = [
	'VersionId',
	'VolumeL',
	'Strategy',
	'StartH',
	'MuSetPerH',
	'SetpointGPerL',
	'DoSetpointPercent',
	'MaxRateLPerH'
] as const;
type SlotField = (typeof FEED_SLOT_FIELDS)[number];

function slotShape(slot: number) {
	const label = `Feed ${slot}`;
	const shape: Record<`feed${number}${SlotField}`, z.ZodType> = {
		[`feed${slot}VersionId`]: z
			.string()
			.optional()
			.transform((v) => v || null),
		[`feed${slot}VolumeL`]: optionalNumber(`${label} volume`, { min: 0, max: 100000, unit: 'L' }),
		[`feed${slot}Strategy`]: z
			.union([z.literal(''), z.enum(FEED_PLAN_STRATEGIES)], {
				error: `${label}: choose a feeding plan`
			})
			.optional()
			.transform((v) => v || null),
		[`feed${slot}StartH`]: optionalNumber(`${label} start`, { min: 0, unit: 'h' }),
		[`feed${slot}MuSetPerH`]: optionalNumber(`${label} μset`, { gt: 0, max: 3, unit: '1/h' }),
		[`feed${slot}SetpointGPerL`]: optionalNumber(`${label} substrate setpoint`, {
			gt: 0,
			max: 500,
			unit: 'g/L'
		}),
		[`feed${slot}DoSetpointPercent`]: optionalNumber(`${label} DO setpoint`, {
			gt: 0,
			max: 99,
			unit: '% of air saturation'
		}),
		[`feed${slot}MaxRateLPerH`]: optionalNumber(`${label} top pump rate`, {
			gt: 0,
			max: 10000,
			unit: 'L/h'
		})
	};
	return shape;
}

const feedSlots = Object.assign(
	{},
	...Array.from({ length: FEED_SLOTS }, (_, i) => slotShape(i + 1))
) as ReturnType<typeof slotShape>;

/** One feed of a study with its own plan, as stored in `study_feed`. */
export interface StudyFeedPlan extends FeedPlan {
	versionId: string;
	volumeL: number;
}

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
	temperatureC: requiredNumber('Temperature', {
		min: STUDY_TEMPERATURE_RANGE_C[0],
		max: STUDY_TEMPERATURE_RANGE_C[1],
		unit: '°C'
	}),
	pressureKPa: requiredNumber('Headspace pressure (absolute)', { min: 50, max: 1000, unit: 'kPa' }),
	o2MoleFraction: requiredNumber('O2 mole fraction of the inlet gas', { gt: 0, max: 1 }),
	doSetpointPercent: requiredNumber('DO setpoint', {
		min: 0,
		max: 99,
		unit: '% of air saturation'
	}),
	safetyFactor: requiredNumber('Safety factor', { min: 1, max: 5 }),
	heatPerMolO2KJ: optionalNumber('Heat per mol O2 consumed', {
		...HEAT_PER_MOL_O2_RANGE_KJ,
		unit: 'kJ/mol'
	}),
	notes: optionalText(),
	...feedSlots
});

export type StudyForm = z.infer<typeof studySchema> &
	Partial<Record<`feed${number}${SlotField}`, string | number | null>>;

export const STUDY_FORM_DEFAULTS = {
	targetBasis: 'biomassGPerL',
	feed1Strategy: 'exponential',
	feed1StartH: '8',
	temperatureC: '37',
	pressureKPa: '101.325',
	o2MoleFraction: String(AIR_O2_MOLE_FRACTION),
	doSetpointPercent: '30',
	safetyFactor: String(DEFAULT_SAFETY_FACTOR)
};

/** What each plan reads beyond volume and start; the rest of the slot is not stored. */
const PLAN_NEEDS: Record<
	FeedPlanStrategy,
	{ field: SlotField; key: keyof StudyFeedPlan; message: string }[]
> = {
	constant: [],
	linear: [],
	exponential: [
		{
			field: 'MuSetPerH',
			key: 'muSetPerH',
			message: 'An exponential plan needs μset, the growth rate it is shaped for.'
		}
	],
	substrateStat: [
		{
			field: 'SetpointGPerL',
			key: 'setpointGPerL',
			message: 'A substrate-stat plan needs the carbon source setpoint it holds, g/L.'
		},
		{
			field: 'MaxRateLPerH',
			key: 'maxRateLPerH',
			message: "A substrate-stat plan needs the pump's top rate, L/h."
		}
	],
	doStat: [
		{
			field: 'DoSetpointPercent',
			key: 'doSetpointPercent',
			message: 'A DO-stat plan needs the DO above which it feeds, % of air saturation.'
		},
		{
			field: 'MaxRateLPerH',
			key: 'maxRateLPerH',
			message: "A DO-stat plan needs the pump's top rate, L/h."
		}
	]
};

function feedsOfForm(form: StudyForm): (StudyFeedPlan & { slot: number })[] {
	const feeds: (StudyFeedPlan & { slot: number })[] = [];
	for (let slot = 1; slot <= FEED_SLOTS; slot++) {
		const value = (field: SlotField) => form[`feed${slot}${field}`] ?? null;
		const versionId = value('VersionId') as string | null;
		const volumeL = value('VolumeL') as number | null;
		if (!versionId && volumeL === null) continue;
		const field = (name: SlotField) => `feed${slot}${name}`;
		if (!versionId)
			throw new RuleError('Choose the feed recipe version for this volume, or clear the volume.', {
				field: field('VersionId')
			});
		const strategy = (value('Strategy') as FeedPlanStrategy | null) ?? null;
		if (!strategy)
			throw new RuleError(`Choose how feed ${slot} is fed.`, { field: field('Strategy') });
		if (volumeL === null) {
			const what = isControlledPlan(strategy)
				? 'the volume of feed available for the run'
				: 'the planned volume of this feed over the run';
			throw new RuleError(`Enter ${what}.`, { field: field('VolumeL') });
		}
		const startH = value('StartH') as number | null;
		if (startH === null)
			throw new RuleError(`Enter when feed ${slot} starts, h after inoculation.`, {
				field: field('StartH')
			});
		if (startH >= form.durationH)
			throw new RuleError(
				`Feed ${slot} must start before the end of the run at ${form.durationH} h.`,
				{ field: field('StartH') }
			);
		const plan: StudyFeedPlan & { slot: number } = {
			slot,
			versionId,
			volumeL,
			strategy,
			startH,
			muSetPerH: null,
			setpointGPerL: null,
			doSetpointPercent: null,
			maxRateLPerH: null
		};
		for (const need of PLAN_NEEDS[strategy]) {
			const v = value(need.field) as number | null;
			if (v === null) throw new RuleError(need.message, { field: field(need.field) });
			(plan as unknown as Record<string, number>)[need.key] = v;
		}
		feeds.push(plan);
	}
	return feeds;
}

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

/** The saved study must evaluate: a target beyond sense or a profile missing data is refused here, with the reason. */
function requireEvaluable(studyId: string, tx: Tx) {
	try {
		evaluateStudy(loadStudyInputs(studyId, tx).inputs);
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

function valuesOf(form: StudyForm) {
	const {
		name,
		basalVersionId,
		profileId,
		vesselId,
		targetBasis,
		targetValue,
		initialVolumeL,
		inoculumDensity,
		durationH,
		temperatureC,
		pressureKPa,
		o2MoleFraction,
		doSetpointPercent,
		safetyFactor,
		heatPerMolO2KJ,
		notes
	} = form;
	return {
		name,
		basalVersionId,
		profileId,
		vesselId,
		targetBasis,
		targetValue,
		initialVolumeL,
		inoculumDensity,
		durationH,
		temperatureC,
		pressureKPa,
		o2MoleFraction,
		doSetpointPercent,
		safetyFactor,
		heatPerMolO2KJ,
		notes
	};
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

export function createStudy(actor: Actor & { id: string }, form: StudyForm): string {
	const feeds = feedsOfForm(form);
	return db.transaction((tx) => {
		checkReferences(form, feeds, tx);
		if (nameTaken(form.name, null, tx))
			throw new RuleError('A study with this name exists; choose another name.', {
				field: 'name',
				status: 409
			});
		const id = crypto.randomUUID();
		tx.insert(study)
			.values({ id, ...valuesOf(form), createdById: actor.id })
			.run();
		insertFeeds(id, feeds, tx);
		requireEvaluable(id, tx);
		recordAudit(
			actor,
			{ action: 'study.created', subjectType: 'study', subjectId: id, detail: { name: form.name } },
			tx
		);
		return id;
	});
}

export function updateStudy(actor: Actor, id: string, revision: number, form: StudyForm): void {
	const feeds = feedsOfForm(form);
	db.transaction((tx) => {
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
			.set({ ...valuesOf(form), revision: revision + 1, updatedAt: new Date() })
			.where(eq(study.id, id))
			.run();
		tx.delete(studyFeed).where(eq(studyFeed.studyId, id)).run();
		insertFeeds(id, feeds, tx);
		requireEvaluable(id, tx);
		recordAudit(
			actor,
			{ action: 'study.updated', subjectType: 'study', subjectId: id, detail: { name: form.name } },
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
	for (const [k, v] of Object.entries(valuesOf(row as unknown as StudyForm)))
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
