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
import { RuleError } from '../rule-error';
import { optionalNumber, optionalText, requiredNumber, requiredText } from './fields';

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

/** The study's own stored fields; the feed slots are stored as `study_feed` rows. */
const studyFieldsShape = {
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
	plannedAgitationRpm: optionalNumber('Stirrer speed', { gt: 0, max: 5000, unit: 'rpm' }),
	plannedGasFlowLPerMin: optionalNumber('Gas flow', { gt: 0, max: 100000, unit: 'L/min' }),
	notes: optionalText()
};

export const studySchema = z
	.object({ ...studyFieldsShape, ...feedSlots })
	.superRefine((form, ctx) => checkFeedSlots(form, ctx), { when: () => true });

const STUDY_FIELD_KEYS = Object.keys(studyFieldsShape) as (keyof typeof studyFieldsShape)[];

/** The columns of `study` a form sets, without its feed slots. */
export function studyFieldsOf(form: StudyForm) {
	return Object.fromEntries(STUDY_FIELD_KEYS.map((key) => [key, form[key]])) as {
		[K in keyof typeof studyFieldsShape]: StudyForm[K];
	};
}

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

type SlotProblem = { field: string; message: string };
type SlotRead = { plan: (StudyFeedPlan & { slot: number }) | null; problems: SlotProblem[] };
/** A slot value that failed its own field check: that field's message already says so. */
const REFUSED = Symbol('refused');

function slotValue(form: Record<string, unknown>, name: string): unknown {
	const v = form[name];
	if (v === undefined || v === null || v === '') return null;
	return v;
}

/** One feed slot: its plan, or every problem of it at once (none for an empty slot). */
function readFeedSlot(form: Record<string, unknown>, slot: number): SlotRead {
	const field = (name: SlotField) => `feed${slot}${name}`;
	const text = (name: SlotField) => {
		const v = slotValue(form, field(name));
		return typeof v === 'string' ? v : null;
	};
	const number = (name: SlotField): number | null | typeof REFUSED => {
		const v = slotValue(form, field(name));
		return v === null ? null : typeof v === 'number' ? v : REFUSED;
	};
	const versionId = text('VersionId');
	const volumeL = number('VolumeL');
	if (!versionId && volumeL === null) return { plan: null, problems: [] };
	const problems: SlotProblem[] = [];
	const problem = (name: SlotField, message: string) =>
		problems.push({ field: field(name), message });
	if (!versionId)
		problem('VersionId', 'Choose the feed recipe version for this volume, or clear the volume.');
	const strategyText = text('Strategy');
	const strategy = FEED_PLAN_STRATEGIES.find((s) => s === strategyText) ?? null;
	if (!strategy && !strategyText) problem('Strategy', `Choose how feed ${slot} is fed.`);
	if (volumeL === null) {
		const what =
			strategy && isControlledPlan(strategy)
				? 'the volume of feed available for the run'
				: 'the planned volume of this feed over the run';
		problem('VolumeL', `Enter ${what}.`);
	}
	const startH = number('StartH');
	const durationH = typeof form.durationH === 'number' ? form.durationH : null;
	if (startH === null) problem('StartH', `Enter when feed ${slot} starts, h after inoculation.`);
	else if (startH !== REFUSED && durationH !== null && startH >= durationH)
		problem('StartH', `Feed ${slot} must start before the end of the run at ${durationH} h.`);
	const plan: StudyFeedPlan & { slot: number } = {
		slot,
		versionId: versionId ?? '',
		volumeL: typeof volumeL === 'number' ? volumeL : 0,
		strategy: strategy ?? 'constant',
		startH: typeof startH === 'number' ? startH : 0,
		muSetPerH: null,
		setpointGPerL: null,
		doSetpointPercent: null,
		maxRateLPerH: null
	};
	for (const need of strategy ? PLAN_NEEDS[strategy] : []) {
		const v = number(need.field);
		if (v === null) problem(need.field, need.message);
		else if (v !== REFUSED) (plan as unknown as Record<string, number>)[need.key] = v;
	}
	const refused = [volumeL, startH].includes(REFUSED) || !strategy;
	return { plan: problems.length || refused ? null : plan, problems };
}

/**
 * The feed slots' rules, run beside the fields' own checks so one save lists every problem: a
 * slot's missing plan values are reported even while another field is refused.
 */
export function checkFeedSlots(form: Record<string, unknown>, ctx: z.RefinementCtx): void {
	for (let slot = 1; slot <= FEED_SLOTS; slot++)
		for (const { field, message } of readFeedSlot(form, slot).problems)
			ctx.addIssue({ code: 'custom', path: [field], message });
}

/** The filled feed slots of the form, each with the fields its plan needs. */
export function feedsOfForm(form: StudyForm): (StudyFeedPlan & { slot: number })[] {
	const feeds: (StudyFeedPlan & { slot: number })[] = [];
	const fieldErrors: Record<string, string[]> = {};
	for (let slot = 1; slot <= FEED_SLOTS; slot++) {
		const { plan, problems } = readFeedSlot(form, slot);
		for (const { field, message } of problems) (fieldErrors[field] ??= []).push(message);
		if (plan) feeds.push(plan);
	}
	const fields = Object.keys(fieldErrors);
	if (fields.length)
		throw new RuleError(fieldErrors[fields[0]][0], { field: fields[0], fieldErrors });
	return feeds;
}
