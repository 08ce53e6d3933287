import { z } from 'zod';
import { FEED_PLAN_STRATEGIES, TARGET_BASES } from '$lib/studies';
import { FEED_SLOTS } from '../../studies/study-form';
import type { studyRecord } from '../../studies/study-api';
import type { ApiOperation } from '../openapi';
import { describes, isoTime } from '../shapes';

// The shapes only: every value is read by the study form's own schema (studies/study-form.ts), which
// answers in the form's words (its labels) at the same paths; feeds.<i> is the form's feed <i + 1>.
const typed = z.union([z.number(), z.string(), z.null()]);
const text = z.string().nullable();

const feedRequest = z.strictObject({
	versionId: text.optional().describe('A version of a feed recipe'),
	volumeL: typed
		.optional()
		.describe('L over the run; for substrate- and DO-stat plans, the volume available'),
	strategy: text.optional().describe(FEED_PLAN_STRATEGIES.join(', ')),
	startH: typed.optional().describe('h after inoculation'),
	muSetPerH: typed.optional().describe('exponential plan: μset, 1/h'),
	setpointGPerL: typed.optional().describe('substrate-stat plan: carbon source setpoint, g/L'),
	doSetpointPercent: typed
		.optional()
		.describe('DO-stat plan: feeds while DO is above this, % of air saturation'),
	maxRateLPerH: typed.optional().describe('substrate- and DO-stat plans: the pump’s top rate, L/h')
});

export const studyRequest = z
	.strictObject({
		name: text.optional(),
		basalVersionId: text.optional().describe('A version of a basal recipe'),
		profileId: text.optional(),
		vesselId: text.optional(),
		targetBasis: text.optional().describe(TARGET_BASES.join(', ')),
		targetValue: typed.optional().describe('g/L dry biomass or cells/mL, as targetBasis'),
		initialVolumeL: typed.optional(),
		inoculumDensity: typed.optional().describe('in the target’s basis'),
		durationH: typed.optional(),
		temperatureC: typed.optional(),
		pressureKPa: typed.optional().describe('headspace pressure, absolute'),
		o2MoleFraction: typed.optional().describe('O2 mole fraction of the inlet gas'),
		doSetpointPercent: typed.optional().describe('% of air saturation'),
		safetyFactor: typed.optional(),
		heatPerMolO2KJ: typed.optional().describe('kJ/mol; the library’s default when blank'),
		plannedAgitationRpm: typed.optional(),
		plannedGasFlowLPerMin: typed.optional(),
		notes: text.optional(),
		feeds: z
			.array(feedRequest)
			.max(FEED_SLOTS, `A study has at most ${FEED_SLOTS} feeds.`)
			.optional()
			.describe('Each feed with its own plan; given, it replaces every feed of the study')
	})
	.describe(
		'Creating: a field left out takes the new-study form’s default (target basis, temperature, pressure, O2, DO setpoint, safety factor) or stays empty. Saving: a field left out keeps its value; null empties it'
	);

const feedPlan = z.object({
	versionId: z.string(),
	volumeL: z.number(),
	strategy: z.enum(FEED_PLAN_STRATEGIES),
	startH: z.number(),
	muSetPerH: z.number().nullable(),
	setpointGPerL: z.number().nullable(),
	doSetpointPercent: z.number().nullable(),
	maxRateLPerH: z.number().nullable()
});

export const studyResponse = describes<ReturnType<typeof studyRecord>>()(
	z.object({
		id: z.string(),
		name: z.string(),
		basalVersionId: z.string(),
		profileId: z.string(),
		vesselId: z.string(),
		targetBasis: z.enum(TARGET_BASES),
		targetValue: z.number().describe('g/L dry biomass or cells/mL, as targetBasis'),
		initialVolumeL: z.number(),
		inoculumDensity: z.number(),
		durationH: z.number(),
		temperatureC: z.number(),
		pressureKPa: z.number(),
		o2MoleFraction: z.number(),
		doSetpointPercent: z.number(),
		safetyFactor: z.number(),
		heatPerMolO2KJ: z.number().nullable(),
		plannedAgitationRpm: z.number().nullable(),
		plannedGasFlowLPerMin: z.number().nullable(),
		notes: z.string(),
		createdById: z.string(),
		createdByName: z.string().nullable(),
		revision: z.int().describe('also the ETag'),
		createdAt: isoTime(),
		updatedAt: isoTime(),
		feeds: z.array(feedPlan)
	})
);

export const studyWriteOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/studies',
		summary:
			'Saves a new study as the new-study form does: every field checked at once in the form’s words, the references looked up, the study evaluated (a target beyond physical sense is refused at targetValue). Answers the study with Location and ETag',
		act: 'study.use',
		request: studyRequest,
		response: studyResponse,
		successStatus: 201,
		errors: [409, 503]
	},
	{
		method: 'get',
		path: '/api/v1/studies/{id}',
		summary: 'One study with its feeds’ plans; its ETag is the revision an update names',
		act: 'study.use',
		response: studyResponse
	},
	{
		method: 'put',
		path: '/api/v1/studies/{id}',
		summary:
			'Saves a study as its edit form does, with the same checks and evaluation. If-Match: the ETag GET answered (412 when it has changed since, 428 without)',
		act: 'study.use',
		request: studyRequest,
		response: studyResponse,
		errors: [409, 412, 428, 503]
	}
];
