import type { FeedPlan, StudyFeedSource, StudyInputs, StudyProfile, StudyVessel } from '$chemistry';

/**
 * A study built by hand for the science tests (no database). The inputs are test settings; the check
 * values in the tests are worked out from them by hand or by an independent formula, each with its
 * source beside it. Biomass fractions: bacterial dry mass, N 14 %, P 3 %, S 1 % (Neidhardt, Ingraham &
 * Schaechter 1990, confirmed in chemistry/REFERENCES.md); C 50 %, K 1 %, Mg 0.5 % (from memory).
 */
export const BACTERIAL_FRACTIONS = { C: 0.5, N: 0.14, P: 0.03, S: 0.01, K: 0.01, Mg: 0.005 };

export const GLUCOSE = 'd-glucose';

export function profileOf(overrides: Partial<StudyProfile> = {}): StudyProfile {
	return {
		name: 'Test bacterium',
		group: 'bacterium',
		kind: 'elementalFractions',
		biomassFormula: null,
		ashFraction: null,
		elementalFractions: { ...BACTERIAL_FRACTIONS },
		fractionsSource: null,
		elementStatements: null,
		componentRequirements: null,
		perCellConsumption: null,
		cellDryMassPg: null,
		carbonSourceId: GLUCOSE,
		yieldXSGPerG: 0.5,
		yieldXSMethod: 'entered',
		respiratoryQuotient: null,
		substrateYields: [],
		muMaxPerH: 0.5,
		ksGPerL: 0.1,
		maintenanceGPerGH: null,
		// Shuler & Kargi (2002) glucose balance: Yx/O2 0.721 g/g (chemistry/REFERENCES.md).
		yieldXO2GPerG: 0.721,
		qO2MmolPerGH: null,
		...overrides
	};
}

export function vesselOf(overrides: Partial<StudyVessel> = {}): StudyVessel {
	return {
		name: 'Test vessel',
		minWorkingVolumeL: 2,
		maxWorkingVolumeL: 10,
		kLaMode: 'entered',
		kLaPerH: 300,
		correlationK: null,
		correlationA: null,
		correlationB: null,
		powerPerVolumeWPerM3: null,
		superficialVelocityMPerS: null,
		o2EnrichmentAllowed: false,
		maxPressureKPa: 200,
		coolingCapacityW: 2000,
		agitationPowerW: 50,
		klaMap: null,
		...overrides
	};
}

export const constantPlan = (startH = 0): FeedPlan => ({
	strategy: 'constant',
	startH,
	muSetPerH: null,
	setpointGPerL: null,
	doSetpointPercent: null,
	maxRateLPerH: null
});

export function feedOf(
	volumeL: number,
	plan: FeedPlan,
	componentsGPerL: Record<string, number> = { [GLUCOSE]: 400 },
	elementsGPerL: Record<string, number> = {}
): StudyFeedSource {
	return {
		versionId: 'feed-1',
		label: 'Glucose feed',
		composition: { componentsGPerL, elementsGPerL },
		volumeL,
		temperatureC: 20,
		plan
	};
}

/** A 5 L batch on 20 g/L glucose to 5 g/L biomass, air at 1 atm and 37 °C. */
export function studyOf(overrides: Partial<StudyInputs> = {}): StudyInputs {
	return {
		plan: {
			name: 'Test study',
			targetBasis: 'biomassGPerL',
			targetValue: 5,
			initialVolumeL: 5,
			inoculumDensity: 0.1,
			durationH: 24,
			temperatureC: 37,
			pressureKPa: 101.325,
			o2MoleFraction: 0.20946,
			doSetpointPercent: 30,
			safetyFactor: 1.2,
			heatPerMolO2KJ: null,
			notes: ''
		},
		basal: {
			versionId: 'basal-1',
			label: 'Basal medium',
			composition: {
				componentsGPerL: { [GLUCOSE]: 20 },
				elementsGPerL: { C: 8, N: 1.5, P: 0.5, S: 0.2, K: 0.5, Mg: 0.1 }
			},
			temperatureC: 20
		},
		feeds: [],
		profile: profileOf(),
		vessel: vesselOf(),
		componentNames: { [GLUCOSE]: 'D-glucose' },
		componentFormulas: { [GLUCOSE]: 'C6H12O6' },
		...overrides
	};
}
