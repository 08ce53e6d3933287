import { describe, expect, it } from 'vitest';
import {
	ChemistryInputError,
	FEED_LIMIT_DEFAULTS,
	StudyDataError,
	balanceCarbonYield,
	computeOxygenYieldFromUptake,
	computeVesselKLa,
	defaultFeedLimits,
	describeCarbonYield,
	listProfileYields,
	requireFeedVolumeFits,
	requireGrowthData,
	resolveOxygenYield,
	toSufficiencyProfile,
	type DefaultUsed,
	type YieldFields
} from '$chemistry';
import { errorOf } from '../input-error';
import { profileOf, studyOf, vesselOf } from './fixture';

// Shuler & Kargi (2002) glucose balance (chemistry/REFERENCES.md): biomass C6H10NO3, i.e. CH1.6667O0.5N0.1667
// per C-mol; Yx/s 0.384 g/g, Yx/O2 0.721 g/g, RQ 1.04.
const SHULER_KARGI_BIOMASS = 'CH1.666667O0.5N0.166667';
const fields = (overrides: Partial<YieldFields>): YieldFields => ({
	kind: 'elementalFractions',
	biomassFormula: SHULER_KARGI_BIOMASS,
	ashFraction: 0,
	elementalFractions: null,
	perCellConsumption: null,
	carbonSourceId: 'd-glucose',
	yieldXSMethod: 'respiratoryQuotient',
	yieldXSGPerG: null,
	respiratoryQuotient: null,
	muMaxPerH: null,
	yieldXO2GPerG: null,
	qO2MmolPerGH: null,
	...overrides
});

describe('Yx/s by element balance', () => {
	it('from RQ 1.04 and from Yx/O2 0.721 g/g gives the published 0.384 g/g', () => {
		expect(
			balanceCarbonYield(fields({ respiratoryQuotient: 1.04 }), 'C6H12O6').yieldGPerG
		).toBeCloseTo(0.384, 3);
		expect(
			balanceCarbonYield(fields({ yieldXSMethod: 'oxygenYield', yieldXO2GPerG: 0.721 }), 'C6H12O6')
				.yieldGPerG
		).toBeCloseTo(0.384, 2);
	});

	it('takes qO2 at μmax as Yx/O2 = μmax/(qO2·M_O2): 0.5 /h over 15 mmol/(g·h) × 31.998 mg/mmol = 1.0417 g/g', () => {
		// O2 = 2 × 15.999 g/mol (IUPAC 2021).
		expect(computeOxygenYieldFromUptake(0.5, 15)).toBeCloseTo(0.5 / (15 * 0.031998), 12);
		const viaQ = balanceCarbonYield(
			fields({ yieldXSMethod: 'oxygenYield', qO2MmolPerGH: 15, muMaxPerH: 0.5 }),
			'C6H12O6'
		);
		const viaY = balanceCarbonYield(
			fields({ yieldXSMethod: 'oxygenYield', yieldXO2GPerG: 0.5 / (15 * 0.031998) }),
			'C6H12O6'
		);
		expect(viaQ.yieldGPerG).toBe(viaY.yieldGPerG);
		expect(viaQ.from).toBe('qO2 15 mmol/(g·h) at μmax 0.5 /h');
	});

	it('names the field that is missing, and the method where the balance itself fails', () => {
		expect(
			errorOf(() =>
				balanceCarbonYield(fields({ biomassFormula: null, respiratoryQuotient: 1.04 }), 'C6H12O6')
			).field
		).toBe('biomassFormula');
		expect(errorOf(() => balanceCarbonYield(fields({}), 'C6H12O6')).field).toBe(
			'respiratoryQuotient'
		);
		expect(
			errorOf(() => balanceCarbonYield(fields({ yieldXSMethod: 'oxygenYield' }), 'C6H12O6')).field
		).toBe('yieldXO2GPerG');
		// RQ 0.5 is below what growth on glucose can give: the balance refuses it.
		const impossible = errorOf(() =>
			balanceCarbonYield(fields({ respiratoryQuotient: 0.5 }), 'C6H12O6')
		);
		expect(impossible.field).toBe('yieldXSMethod');
		expect(impossible.message).toMatch(/cannot have an RQ of 0.5/);
	});

	it('says where a balanced yield came from, and why it no longer holds', () => {
		expect(describeCarbonYield(fields({ respiratoryQuotient: 1.04 }), 'C6H12O6')).toMatch(
			/^Element balance \(C, H, O, N; NH3 as N source\) from RQ 1.04; a 1 % error in it moves Yx\/s by about 13 %$/
		);
		expect(describeCarbonYield(fields({ respiratoryQuotient: 1.04 }), null)).toBe(
			'Element balance, which now fails: the carbon source has no formula in the library.'
		);
		expect(describeCarbonYield(fields({ yieldXSMethod: 'entered' }), null)).toBe(
			'Entered on the profile'
		);
	});
});

describe('the profile as a study reads it', () => {
	it('asks for each growth number it lacks, as the study data at profile.<field>', () => {
		for (const field of ['carbonSourceId', 'yieldXSGPerG', 'muMaxPerH', 'ksGPerL'] as const) {
			const error = errorOf(() => requireGrowthData(profileOf({ [field]: null })));
			expect(error).toBeInstanceOf(StudyDataError);
			expect(error.field).toBe(`profile.${field}`);
		}
		expect(listProfileYields(profileOf({ muMaxPerH: null }), studyOf())).toEqual([]);
		const perCell = errorOf(() =>
			toSufficiencyProfile(
				profileOf({
					kind: 'perCell',
					perCellConsumption: [{ key: 'd-glucose', basis: 'component', pgPerCell: 350 }]
				})
			)
		);
		expect(perCell.field).toBe('profile.cellDryMassPg');
	});

	it('works Yx/O2 out from qO2, else from the balance with Yx/s, and lists how', () => {
		const defaults: DefaultUsed[] = [];
		expect(
			resolveOxygenYield(profileOf({ yieldXO2GPerG: null, qO2MmolPerGH: 15 }), 'C6H12O6', defaults)
		).toBeCloseTo(0.5 / (15 * 0.031998), 12);
		expect(defaults[0].source).toBe(
			"From the profile's qO2 15 mmol/(g·h), taken as measured at μmax 0.5 /h"
		);
		// Shuler & Kargi: Yx/s 0.384 g/g on glucose ↔ Yx/O2 0.721 g/g.
		const balanced = resolveOxygenYield(
			profileOf({
				yieldXO2GPerG: null,
				yieldXSGPerG: 0.384,
				biomassFormula: SHULER_KARGI_BIOMASS,
				ashFraction: 0
			}),
			'C6H12O6',
			[]
		);
		expect(balanced).toBeCloseTo(0.721, 2);
		const none = errorOf(() => resolveOxygenYield(profileOf({ yieldXO2GPerG: null }), null, []));
		expect(none).toBeInstanceOf(StudyDataError);
		expect(none.field).toBe('profile.yieldXO2GPerG');
	});
});

describe('the vessel', () => {
	it("computes kLa = k·(P/V)^a·v_s^b in 1/s (van 't Riet 1979 form) and reports it per hour", () => {
		// k 0.026, a 0.4, b 0.5 (van 't Riet's coalescing-water constants, from memory); P/V 1000 W/m³, v_s 0.01 m/s:
		// 0.026 × 1000^0.4 × 0.01^0.5 × 3600 = 148.346 1/h (python3: 0.026*1000**0.4*0.01**0.5*3600).
		const vessel = vesselOf({
			kLaMode: 'correlation',
			correlationK: 0.026,
			correlationA: 0.4,
			correlationB: 0.5,
			powerPerVolumeWPerM3: 1000,
			superficialVelocityMPerS: 0.01
		});
		expect(computeVesselKLa(vessel, 5).kLaPerH).toBeCloseTo(148.346, 3);
		const lacking = errorOf(() => computeVesselKLa({ ...vessel, correlationB: null }, 5));
		expect(lacking).toBeInstanceOf(StudyDataError);
		expect(lacking.field).toBe('vessel.correlationK');
	});

	it('leaves the feed designer the room above the initial volume, and refuses more', () => {
		// Vessel 10 L, initial 5 L: 5 L of room.
		expect(requireFeedVolumeFits(studyOf(), 4)).toBe(5);
		const over = errorOf(() => requireFeedVolumeFits(studyOf(), 6));
		expect(over).not.toBeInstanceOf(StudyDataError);
		expect(over).toBeInstanceOf(ChemistryInputError);
		expect(over.message).toBe(
			"6 L of feed on 5 L would exceed the vessel's maximum working volume of 10 L; at most 5 L fits."
		);
		expect(errorOf(() => requireFeedVolumeFits(studyOf(), 0)).field).toBe('feedVolumeL');
		// Cell lines get the cell-culture limits, bacteria and yeasts the microbial ones.
		expect(defaultFeedLimits('mammalian')).toEqual(FEED_LIMIT_DEFAULTS.cellCulture);
		expect(defaultFeedLimits('yeast')).toEqual(FEED_LIMIT_DEFAULTS.microbial);
	});
});
