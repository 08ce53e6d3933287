import { requirePermission } from '$lib/server/guard';
import { listVessels } from '$lib/server/studies/queries';
import { toStudyVessel } from '$lib/server/vessels/kla-map';
import { StudyDataError, computeVesselKLa } from '$chemistry';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('study.use');
	return {
		vessels: listVessels().map((v) => {
			let kLaPerH: number | null = null;
			try {
				// the map's kLa at the vessel's largest working volume, as a single figure for the list
				kLaPerH = computeVesselKLa(toStudyVessel(v), v.maxWorkingVolumeL).kLaPerH;
			} catch (cause) {
				if (!(cause instanceof StudyDataError)) throw cause;
			}
			return {
				id: v.id,
				name: v.name,
				minWorkingVolumeL: v.minWorkingVolumeL,
				maxWorkingVolumeL: v.maxWorkingVolumeL,
				kLaPerH,
				kLaMode: v.kLaMode,
				o2EnrichmentAllowed: v.o2EnrichmentAllowed,
				coolingCapacityW: v.coolingCapacityW,
				maxPressureKPa: v.maxPressureKPa,
				isDemo: v.isDemo
			};
		})
	};
};
