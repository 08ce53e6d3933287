import { describe, expect, it } from 'vitest';
import {
	AIR_O2_MOLE_FRACTION,
	OXYGEN_ENRICHMENT_CAUTION,
	STUDY_CAUTIONS,
	isOxygenEnriched,
	studyCautions
} from '$chemistry';

describe('the cautions a study carries', () => {
	it('counts as enriched only gas richer in O2 than air (0.20946, dry air)', () => {
		expect(isOxygenEnriched(AIR_O2_MOLE_FRACTION)).toBe(false);
		// Within the tolerance of 1e-4 a typed 0.2095 or 0.21 still reads as air.
		expect(isOxygenEnriched(0.2095)).toBe(false);
		expect(isOxygenEnriched(0.21)).toBe(true);
		expect(isOxygenEnriched(0.5)).toBe(true);
		expect(isOxygenEnriched(0.15)).toBe(false);
	});

	it('leaves out the fire caution for air and keeps every other caution', () => {
		const air = studyCautions(AIR_O2_MOLE_FRACTION);
		expect(air).not.toContain(OXYGEN_ENRICHMENT_CAUTION);
		expect(air).toEqual(STUDY_CAUTIONS.filter((c) => c !== OXYGEN_ENRICHMENT_CAUTION));
		expect(studyCautions(0.5)).toEqual(STUDY_CAUTIONS);
		expect(studyCautions(0.5)[0]).toMatch(/fire/);
	});
});
