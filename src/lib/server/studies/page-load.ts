import { error } from '@sveltejs/kit';
import { computeVesselKLa } from '$chemistry';
import { describeFeedPlan } from '$lib/studies';
import { RuleError } from '../rule-error';
import { evaluateStudy } from './evaluate';
import { findStudy, loadStudyInputs } from './queries';

/** The study with its report; a report that cannot be made is shown with its reason, not as a crash. */
export async function loadStudyReport(id: string) {
	if (!findStudy(id)) error(404, { message: 'No such study.' });
	const { inputs, versions } = loadStudyInputs(id);
	let report: Awaited<ReturnType<typeof evaluateStudy>> | null = null;
	let reportError: string | null = null;
	try {
		report = await evaluateStudy(inputs);
	} catch (cause) {
		if (!(cause instanceof RuleError)) throw cause;
		reportError = cause.message;
	}
	let vesselKLaPerH: number | null = null;
	try {
		vesselKLaPerH = computeVesselKLa(inputs.vessel, inputs.plan.initialVolumeL, {
			agitationRpm: inputs.plan.plannedAgitationRpm,
			gasFlowLPerMin: inputs.plan.plannedGasFlowLPerMin
		}).kLaPerH;
	} catch {
		vesselKLaPerH = null;
	}
	return {
		study: { id, ...inputs.plan },
		profile: {
			id: inputs.profile.id,
			name: inputs.profile.name,
			group: inputs.profile.group,
			kind: inputs.profile.kind
		},
		vessel: {
			id: inputs.vessel.id,
			name: inputs.vessel.name,
			o2EnrichmentAllowed: inputs.vessel.o2EnrichmentAllowed,
			maxWorkingVolumeL: inputs.vessel.maxWorkingVolumeL,
			kLaPerH: vesselKLaPerH
		},
		basal: versions.get(inputs.basal.versionId)!,
		basalComponentIds: Object.keys(inputs.basal.composition.componentsGPerL),
		feeds: inputs.feeds.map((f) => ({
			...versions.get(f.versionId)!,
			volumeL: f.volumeL,
			planText: describeFeedPlan(f.plan, f.volumeL),
			temperatureC: f.temperatureC,
			componentIds: Object.keys(f.composition.componentsGPerL)
		})),
		report,
		reportError
	};
}
