import { describe, expect, it } from 'vitest';
import {
	StudyDataError,
	computeOperatingPoint,
	computeVesselKLa,
	evaluateStudy,
	fitKlaCorrelation,
	type VesselKlaMap
} from '$chemistry';
import { errorOf } from '../input-error';
import { studyOf, vesselOf } from './fixture';

// A study in a vessel whose kLa comes from its own measured map: the correlation fitted through the
// points, evaluated at the planned stirrer speed and gas flow with the plan's volume.

// Geometry of a 10 L bench vessel (invented for the test): T 0.2 m, two impellers of D 0.07 m, Np 5.
const geometry = {
	vesselDiameterM: 0.2,
	impellerDiameterM: 0.07,
	impellerCount: 2,
	powerNumber: 5
};
// kLa = K·(P/V)^a·v_s^b with K 0.026, a 0.4, b 0.5 (van 't Riet 1979, coalescing broth): the points
// are made from it exactly, so the fit must give it back and the map must predict it.
const [K, A, B] = [0.026, 0.4, 0.5];

function mapOf(planned: { rpm: number; flowLPerMin: number }): VesselKlaMap {
	const points = [
		[400, 4],
		[400, 10],
		[600, 6],
		[800, 8],
		[800, 12],
		[1000, 10]
	].map(([rpm, flow]) => {
		const at = computeOperatingPoint({
			...geometry,
			agitationRpm: rpm,
			gasFlowLPerMin: flow,
			liquidVolumeL: 8
		});
		return {
			powerPerVolumeWPerM3: at.powerPerVolumeWPerM3,
			superficialVelocityMPerS: at.superficialVelocityMPerS,
			kLaPerS: K * at.powerPerVolumeWPerM3 ** A * at.superficialVelocityMPerS ** B
		};
	});
	const fit = fitKlaCorrelation(points);
	return {
		correlation: fit,
		pointCount: points.length,
		geometry,
		plannedAgitationRpm: planned.rpm,
		plannedGasFlowLPerMin: planned.flowLPerMin
	};
}

describe("a study's kLa from the vessel's measured map", () => {
	it('is the correlation at the planned speed and flow, with P/V and v_s worked by hand', () => {
		const vessel = vesselOf({
			kLaMode: 'map',
			kLaPerH: null,
			klaMap: mapOf({ rpm: 700, flowLPerMin: 9 })
		});
		const result = computeVesselKLa(vessel, 6);
		// Hand: P = 2 × 5 × 1000 kg/m³ × (700/60 s⁻¹)³ × (0.07 m)⁵ = 26.69 W; P/V = 26.69 W / 0.006 m³.
		const powerW = 2 * 5 * 1000 * (700 / 60) ** 3 * 0.07 ** 5;
		const pv = powerW / 0.006;
		// v_s = (9 L/min ÷ 60 000) / (π × 0.2² / 4) = 4.775 mm/s (4.7746).
		const vs = 9 / 60000 / ((Math.PI * 0.2 ** 2) / 4);
		expect(powerW).toBeCloseTo(26.69, 2);
		expect(vs * 1000).toBeCloseTo(4.7746, 3);
		expect(result.kLaPerH).toBeCloseTo(K * pv ** A * vs ** B * 3600, 6);
		expect(result.warning).toBeNull();
		expect(result.origin).toMatch(/measured kLa map \(6 points/);
		expect(result.origin).toContain("at the vessel's planned 700 rpm and 9 L/min with 6 L");
	});

	it("takes the study's own stirrer speed and gas flow over the vessel's planned ones", () => {
		const vessel = vesselOf({
			kLaMode: 'map',
			kLaPerH: null,
			klaMap: mapOf({ rpm: 700, flowLPerMin: 9 })
		});
		const ownSpeed = computeVesselKLa(vessel, 6, { agitationRpm: 900, gasFlowLPerMin: null });
		const at900 = computeOperatingPoint({
			...geometry,
			agitationRpm: 900,
			gasFlowLPerMin: 9,
			liquidVolumeL: 6
		});
		expect(ownSpeed.kLaPerH).toBeCloseTo(
			K * at900.powerPerVolumeWPerM3 ** A * at900.superficialVelocityMPerS ** B * 3600,
			6
		);
		expect(ownSpeed.origin).toContain("at the study's 900 rpm and 9 L/min");
		const report = evaluateStudy(
			studyOf({
				plan: { ...studyOf().plan, plannedAgitationRpm: 900 },
				vessel
			})
		);
		// the study's own volume (5 L) sets its P/V
		const atStudyVolume = computeVesselKLa(vessel, 5, { agitationRpm: 900 });
		expect(report.inputs.kLaPerH).toBeCloseTo(atStudyVolume.kLaPerH, 6);
	});

	it('warns when the plan lies outside what was measured, and says by how much', () => {
		const vessel = vesselOf({
			kLaMode: 'map',
			kLaPerH: null,
			klaMap: mapOf({ rpm: 1500, flowLPerMin: 9 })
		});
		const result = computeVesselKLa(vessel, 6);
		expect(result.warning).toMatch(/outside the vessel's measured kLa map: P\/V/);
		expect(result.warning).toMatch(/extrapolated/);
	});

	it('lists the kLa and where it came from in the study defaults, and carries the warning', () => {
		const inside = evaluateStudy(
			studyOf({
				vessel: vesselOf({
					kLaMode: 'map',
					kLaPerH: null,
					klaMap: mapOf({ rpm: 700, flowLPerMin: 9 })
				})
			})
		);
		const entry = inside.defaults.find((d) => d.what === 'kLa');
		expect(entry?.source).toMatch(/^From the vessel's measured kLa map/);
		expect(inside.inputs.kLaOrigin).toMatch(/measured kLa map/);
		const outside = evaluateStudy(
			studyOf({
				vessel: vesselOf({
					kLaMode: 'map',
					kLaPerH: null,
					klaMap: mapOf({ rpm: 1500, flowLPerMin: 30 })
				})
			})
		);
		expect(outside.warnings.some((w) => w.includes("outside the vessel's measured kLa map"))).toBe(
			true
		);
		// a what-if kLa is the person's own: no map warning, no map default
		const whatIf = evaluateStudy(
			studyOf({
				vessel: vesselOf({
					kLaMode: 'map',
					kLaPerH: null,
					klaMap: mapOf({ rpm: 1500, flowLPerMin: 30 })
				})
			}),
			{ kLaPerH: 300 }
		);
		expect(whatIf.warnings.some((w) => w.includes('kLa map'))).toBe(false);
		expect(whatIf.defaults.some((d) => d.what === 'kLa')).toBe(false);
	});

	it('refuses a map vessel without enough points or without its planned operation', () => {
		const none = errorOf(() => computeVesselKLa(vesselOf({ kLaMode: 'map', klaMap: null }), 6));
		expect(none).toBeInstanceOf(StudyDataError);
		expect(none.message).toMatch(/at least 3 measured points/);
		const map = { ...mapOf({ rpm: 700, flowLPerMin: 9 }), plannedAgitationRpm: null };
		const unplanned = errorOf(() => computeVesselKLa(vesselOf({ kLaMode: 'map', klaMap: map }), 6));
		expect(unplanned.message).toMatch(/lacks a stirrer speed and gas flow/);
	});
});
