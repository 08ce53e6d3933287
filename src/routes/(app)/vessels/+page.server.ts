import { requirePermission } from '$lib/server/guard';
import { listVessels } from '$lib/server/studies/queries';
import { StudyDataError, computeVesselKLa } from '$chemistry';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission('study.use');
	return {
		vessels: listVessels().map((v) => {
			let kLaPerH: number | null = null;
			try {
				kLaPerH = computeVesselKLa(v).kLaPerH;
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
