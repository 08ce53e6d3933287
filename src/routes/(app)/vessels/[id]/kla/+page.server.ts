import { error, redirect } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { formatDay } from '$lib/date-time';
import { db } from '$lib/server/db';
import { vessel } from '$lib/server/db/schema';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { requireActor, requirePermission } from '$lib/server/guard';
import { siteTimeZone } from '$lib/server/site-time-zone';
import { klaMeasureSchema, measureKla, saveKlaPoint } from '$lib/server/vessels/kla-measure';
import { vesselGeometry } from '$lib/server/vessels/kla-map';
import type { Actions, PageServerLoad } from './$types';

function vesselOr404(id: string) {
	const row = db.select().from(vessel).where(eq(vessel.id, id)).get();
	if (!row) error(404, { message: 'No such vessel.' });
	return row;
}

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('run.record');
	const row = vesselOr404(params.id);
	const text = (x: number | null) => (x === null ? '' : String(x));
	return {
		vessel: {
			id: row.id,
			name: row.name,
			o2EnrichmentAllowed: row.o2EnrichmentAllowed,
			hasGeometry: vesselGeometry(row) !== null
		},
		values: {
			method: 'gassingOut',
			measuredOn: formatDay(new Date(), siteTimeZone()),
			agitationRpm: text(row.plannedAgitationRpm),
			gasFlowLPerMin: text(row.plannedGasFlowLPerMin),
			liquidVolumeL: text(row.maxWorkingVolumeL),
			temperatureC: text(row.temperatureC)
		} as Record<string, string>
	};
};

export const actions: Actions = {
	fit: async ({ request, params }) => {
		requirePermission('run.record');
		const row = vesselOr404(params.id);
		const formData = await request.formData();
		const parsed = parseForm(klaMeasureSchema, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			const measured = measureKla(row, parsed.data);
			return {
				measured: {
					kLaPerH: measured.kLaPerH,
					kLaLowPerH: measured.kLaLowPerH,
					kLaHighPerH: measured.kLaHighPerH,
					ourPerH: measured.ourPerH,
					warnings: measured.warnings,
					powerPerVolumeWPerM3: measured.powerPerVolumeWPerM3,
					superficialVelocityMPerS: measured.superficialVelocityMPerS,
					powerNote: measured.powerNote,
					readings: measured.readings,
					fit: measured.fit
						? {
								curve: measured.fit.curve,
								residualSd: measured.fit.residualSd,
								rSquared: measured.fit.rSquared,
								pointsUsed: measured.fit.pointsUsed,
								saturation: measured.fit.saturation.value,
								initial: measured.fit.initial.value,
								residuals: measured.fit.residuals,
								startS: measured.fit.startS
							}
						: null
				},
				values: Object.fromEntries(
					[...formData.entries()].filter(([, v]) => typeof v === 'string')
				) as Record<string, string>
			};
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	},
	save: async ({ request, params }) => {
		const actor = requireActor('run.record');
		vesselOr404(params.id);
		const formData = await request.formData();
		const parsed = parseForm(klaMeasureSchema, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			saveKlaPoint(actor, params.id, parsed.data);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/vessels/${params.id}?klaSaved=1#kla-map`);
	}
};
