import { redirect } from '@sveltejs/kit';
import { asc } from 'drizzle-orm';
import { formatIsoLocal } from '$lib/date-time';
import { db } from '$lib/server/db';
import { study } from '$lib/server/db/schema';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { requireActor, requirePermission } from '$lib/server/guard';
import { createRun, RUN_FORM_DEFAULTS, runSchema } from '$lib/server/runs/run-store';
import { siteTimeZone } from '$lib/server/site-time-zone';
import { listProfiles, listVessels } from '$lib/server/studies/queries';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('run.record');
	const zone = siteTimeZone();
	return {
		studies: db
			.select({
				id: study.id,
				name: study.name,
				vesselId: study.vesselId,
				profileId: study.profileId
			})
			.from(study)
			.orderBy(asc(study.name))
			.all(),
		vessels: listVessels().map((v) => ({ id: v.id, name: v.name })),
		profiles: listProfiles().map((p) => ({ id: p.id, name: p.name })),
		timeZone: zone,
		values: {
			studyId: url.searchParams.get('study') ?? '',
			startedAt: formatIsoLocal(new Date(), zone).slice(0, 16),
			...RUN_FORM_DEFAULTS
		} as Record<string, string>
	};
};

export const actions: Actions = {
	create: async ({ request }) => {
		const actor = requireActor('run.record');
		const formData = await request.formData();
		const parsed = parseForm(runSchema, formData);
		if (!parsed.ok) return parsed.failure;
		let created: { id: string };
		try {
			created = createRun(actor, parsed.data);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/runs/${created.id}?created=1`);
	}
};
