import { FEED_PLAN_LABELS, TARGET_BASIS_UNITS } from '$lib/studies';
import { listProfiles, listStudyVersionChoices, listVessels } from './queries';

/** The choices a study form offers. */
export function loadStudyChoices() {
	return {
		basalVersions: listStudyVersionChoices('basal'),
		feedVersions: listStudyVersionChoices('feed'),
		profiles: listProfiles().map((p) => ({
			id: p.id,
			name: p.name,
			group: p.group,
			cellDryMassPg: p.cellDryMassPg
		})),
		vessels: listVessels().map((v) => ({
			id: v.id,
			name: v.name,
			maxWorkingVolumeL: v.maxWorkingVolumeL,
			maxPressureKPa: v.maxPressureKPa,
			temperatureC: v.temperatureC
		})),
		strategyLabels: FEED_PLAN_LABELS,
		targetUnits: TARGET_BASIS_UNITS
	};
}
