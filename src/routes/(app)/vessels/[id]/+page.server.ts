import { error, redirect } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { vessel } from '$lib/server/db/schema';
import { may } from '$lib/permissions';
import { ruleFailure } from '$lib/server/forms';
import { requireActor, requirePermission } from '$lib/server/guard';
import { removeKlaPoint } from '$lib/server/vessels/kla-measure';
import { submitVessel } from '$lib/server/studies/vessel-page';
import { vesselFormValues } from '$lib/server/studies/vessel-store';
import { fitKlaMap, listKlaPoints } from '$lib/server/vessels/kla-map';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const user = requirePermission('study.use');
	const row = db.select().from(vessel).where(eq(vessel.id, params.id)).get();
	if (!row) error(404, { message: 'No such vessel.' });
	const points = listKlaPoints(row.id);
	const map = fitKlaMap(points);
	return {
		values: vesselFormValues(row),
		name: row.name,
		id: row.id,
		isDemo: row.isDemo,
		klaPoints: points.map(({ readings: _readings, ...p }) => p),
		klaFit: map.fit
			? {
					k: map.fit.k,
					a: map.fit.a,
					b: map.fit.b,
					intervals95: map.fit.intervals95,
					intervalNote: map.fit.intervalNote,
					rSquared: map.fit.rSquared,
					points: map.fit.points,
					measuredRange: map.fit.measuredRange
				}
			: null,
		klaFitProblem: map.problem,
		kLaMode: row.kLaMode,
		canMeasure: may(user, 'run.record')
	};
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const actor = requirePermission('study.use');
		const result = submitVessel(actor, await request.formData(), params.id);
		if ('failure' in result) return result.failure;
		redirect(303, `/vessels/${params.id}?saved=1`);
	},
	removePoint: async ({ request, params }) => {
		const actor = requireActor('run.record');
		const formData = await request.formData();
		try {
			removeKlaPoint(
				actor,
				params.id,
				String(formData.get('pointId') ?? ''),
				String(formData.get('reason') ?? '')
			);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/vessels/${params.id}?klaRemoved=1#kla-map`);
	}
};
