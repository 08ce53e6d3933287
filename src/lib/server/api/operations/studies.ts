import { z } from 'zod';
import { STUDY_ROLES } from '$lib/studies';
import type { ApiOperation } from '../openapi';

const finite = z.number({ error: 'Give a number.' });

// Strict at every level: a misspelt key is a 400 naming it, never silently ignored.
export const evaluateRequest = z.strictObject({
	studyId: z.string().min(1).max(80),
	whatIf: z
		.strictObject({
			targetValue: finite.optional().describe('g/L dry biomass or cells/mL, as the study'),
			feedVolumeL: finite.optional().describe('Total feed volume: planned for open plans, available for substrate- and DO-stat plans; every feed is scaled in proportion'),
			kLaPerH: finite.optional(),
			o2MoleFraction: finite.optional().describe('O2 mole fraction of the inlet gas, 0–1'),
			temperatureC: finite.optional()
		})
		.default({})
});

export const feedDesignRequest = z.strictObject({
	componentIds: z.array(z.string().min(1).max(80)).min(1, 'Choose at least one component.').max(40),
	feedVolumeL: finite,
	temperatureC: finite.min(0, 'At least 0 °C').max(60, 'At most 60 °C')
});

const roles = [...STUDY_ROLES];

export const studiesOperations: ApiOperation[] = [
	{ method: 'get', path: '/api/v1/studies', summary: 'Lists saved studies with the recipe versions they use and whether any is superseded', access: roles },
	{
		method: 'post',
		path: '/api/v1/studies/evaluate',
		summary: 'Evaluates a saved study with what-if changes (target, feed volume, kLa, O2 fraction, temperature): verdict, limit, per-nutrient table, oxygen, heat, volume, time course, defaults used',
		access: roles,
		request: evaluateRequest,
		errors: [404, 422]
	},
	{
		method: 'post',
		path: '/api/v1/studies/{id}/feed-design',
		summary: "Proposes a feed concentrate (g/L per component) that covers every nutrient at the study's target and safety factor within solubility and vessel volume, or says why it cannot",
		access: roles,
		request: feedDesignRequest,
		errors: [422]
	}
];
