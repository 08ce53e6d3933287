import { describe, expect, it } from 'vitest';
import { computeStudentTQuantile, fitGrowthCurve } from '../../chemistry/growth-fit';
import { simulateRun } from '../../chemistry/simulation';
import { errorOf } from './input-error';

/** mulberry32, a small public-domain 32-bit seeded generator, with Box & Muller (1958) normals. */
function createNormalSource(seed: number): () => number {
	let state = seed >>> 0;
	const uniform = () => {
		state = (state + 0x6d2b79f5) >>> 0;
		let z = state;
		z = Math.imul(z ^ (z >>> 15), z | 1);
		z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
		return ((z ^ (z >>> 14)) >>> 0) / 4294967296;
	};
	return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

describe('computeStudentTQuantile', () => {
	it.each([
		[1, 12.706],
		[2, 4.303],
		[3, 3.182],
		[4, 2.776],
		[5, 2.571],
		[10, 2.228],
		[20, 2.086],
		[30, 2.042],
		[120, 1.98]
	])('t(0.975, %i) matches the printed table', (df, table) => {
		// Two-sided 95 % points of Student's t as printed in standard tables (e.g. Abramowitz & Stegun 1964,
		// Table 26.10; table number from memory), 3 decimals.
		expect(computeStudentTQuantile(0.975, df)).toBeCloseTo(table, 3);
	});

	it('is exact where the CDF has an elementary inverse', () => {
		// ν = 1 (Cauchy): t = tan(π(p − ½)); ν = 2: t = (2p − 1)/√(2p(1 − p)) (closed forms).
		for (const p of [0.6, 0.9, 0.975, 0.995]) {
			expect(computeStudentTQuantile(p, 1)).toBeCloseTo(Math.tan(Math.PI * (p - 0.5)), 9);
			expect(computeStudentTQuantile(p, 2)).toBeCloseTo(
				(2 * p - 1) / Math.sqrt(2 * p * (1 - p)),
				9
			);
		}
		expect(computeStudentTQuantile(0.025, 7)).toBeCloseTo(-computeStudentTQuantile(0.975, 7), 12);
	});

	it('tends to the normal quantile 1.959964 for many degrees of freedom', () => {
		// z(0.975) = 1.959964 (standard normal table).
		expect(computeStudentTQuantile(0.975, 100_000)).toBeCloseTo(1.959964, 4);
	});
});

describe('fitGrowthCurve', () => {
	const truth = { muMaxPerH: 0.4, ksGPerL: 0.3, yieldXS: 0.45 };
	const run = simulateRun({
		mode: 'batch',
		kinetics: truth,
		initial: { biomassGPerL: 0.05, substrateGPerL: 20, volumeL: 1 },
		endH: 24,
		// Every 15 min: Ks is only seen in the last hour before exhaustion, and μmax is tied to Ks.
		outputEveryH: 0.25
	});

	function noisyData(seed: number, relativeNoise: number) {
		const normal = createNormalSource(seed);
		return {
			timeH: run.t,
			biomassGPerL: run.biomassGPerL.map((x) => x * (1 + relativeNoise * normal())),
			substrateGPerL: run.substrateGPerL.map((s) => Math.max(0, s * (1 + relativeNoise * normal())))
		};
	}

	it('recovers μmax and Yx/s within 2 % from model data with 2 % noise', () => {
		// Data from the integrated model (simulateRun); the fit uses the implicit closed form, so the
		// two computations are independent.
		const fit = fitGrowthCurve(noisyData(20240611, 0.02));
		expect(fit.monodFit).not.toBeNull();
		expect(Math.abs(fit.monodFit!.muMaxPerH / truth.muMaxPerH - 1)).toBeLessThan(0.02);
		expect(Math.abs(fit.monodFit!.yieldXS / truth.yieldXS - 1)).toBeLessThan(0.02);
		expect(Math.abs(fit.yieldXS!.value / truth.yieldXS - 1)).toBeLessThan(0.02);
		expect(fit.monodFit!.curve.t).toHaveLength(200);
	});

	it('recovers all parameters closely from noise-free data', () => {
		const fit = fitGrowthCurve({
			timeH: run.t,
			biomassGPerL: run.biomassGPerL,
			substrateGPerL: run.substrateGPerL
		});
		const m = fit.monodFit!;
		expect(m.muMaxPerH / truth.muMaxPerH - 1).toBeCloseTo(0, 4);
		expect(m.ksGPerL / truth.ksGPerL - 1).toBeCloseTo(0, 2);
		expect(m.yieldXS / truth.yieldXS - 1).toBeCloseTo(0, 4);
		expect(m.initialBiomassGPerL).toBeCloseTo(0.05, 5);
		expect(m.biomassRmsGPerL).toBeLessThan(1e-4);
	});

	it('holds Yx/s at the −dX/dS estimate when asked not to fit it', () => {
		const fit = fitGrowthCurve({ ...noisyData(11, 0.02), fitYield: false });
		expect(fit.monodFit!.yieldXS).toBe(fit.yieldXS!.value);
		expect(Math.abs(fit.monodFit!.muMaxPerH / truth.muMaxPerH - 1)).toBeLessThan(0.02);
	});

	it('finds the exponential phase and gives μ with a t-based 95 % interval', () => {
		const fit = fitGrowthCurve(noisyData(7, 0.02));
		const phase = fit.exponentialPhase;
		expect(phase.pointCount).toBeGreaterThanOrEqual(4);
		expect(phase.rSquared).toBeGreaterThanOrEqual(0.98);
		// While S ≫ Ks the slope of ln X is close to μmax (Monod 1949).
		expect(Math.abs(phase.muMaxPerH.value / truth.muMaxPerH - 1)).toBeLessThan(0.05);
		const half =
			computeStudentTQuantile(0.975, phase.pointCount - 2) * phase.muMaxPerH.standardError;
		expect(phase.muMaxPerH.lower95).toBeCloseTo(phase.muMaxPerH.value - half, 12);
		expect(phase.muMaxPerH.upper95).toBeCloseTo(phase.muMaxPerH.value + half, 12);
		// t_d = ln 2/μ, and its interval maps from μ's.
		expect(phase.doublingTimeH.value).toBeCloseTo(Math.LN2 / phase.muMaxPerH.value, 12);
		expect(phase.doublingTimeH.lower95).toBeCloseTo(Math.LN2 / phase.muMaxPerH.upper95!, 12);
		expect(phase.curve.t[0]).toBe(phase.startH);
	});

	it('leaves out points with DO below 5 % of its highest value', () => {
		const t = Array.from({ length: 12 }, (_, i) => i);
		const x = t.map((ti) => 0.1 * Math.exp(0.3 * ti));
		const dissolvedOxygenMgPerL = t.map((ti) => (ti < 3 ? 0.1 : 6));
		const fit = fitGrowthCurve({ timeH: t, biomassGPerL: x, dissolvedOxygenMgPerL });
		expect(fit.oxygenLimitedIndices).toEqual([0, 1, 2]);
		expect(fit.exponentialPhase.startIndex).toBeGreaterThanOrEqual(3);
		expect(fit.exponentialPhase.muMaxPerH.value).toBeCloseTo(0.3, 10);
		expect(fit.monodFit).toBeNull();
	});

	it('refuses data it cannot fit, naming the field', () => {
		expect(errorOf(() => fitGrowthCurve({ timeH: [0, 1, 2], biomassGPerL: [1, 2, 4] })).field).toBe(
			'timeH'
		);
		expect(
			errorOf(() => fitGrowthCurve({ timeH: [0, 1, 1, 2], biomassGPerL: [1, 2, 3, 4] })).field
		).toBe('timeH.2');
		expect(
			errorOf(() => fitGrowthCurve({ timeH: [0, 1, 2, 3], biomassGPerL: [1, 0, 3, 4] })).field
		).toBe('biomassGPerL.1');
		expect(
			errorOf(() => fitGrowthCurve({ timeH: [0, 1, 2, 3], biomassGPerL: [1, 2, 3] })).field
		).toBe('biomassGPerL');
		expect(
			errorOf(() =>
				fitGrowthCurve({
					timeH: [0, 1, 2, 3],
					biomassGPerL: [1, 2, 3, 4],
					substrateGPerL: [4, 3, -1, 0]
				})
			).field
		).toBe('substrateGPerL.2');
		// A falling culture has no exponential phase.
		expect(
			errorOf(() => fitGrowthCurve({ timeH: [0, 1, 2, 3, 4], biomassGPerL: [5, 4, 3, 2, 1] })).field
		).toBe('biomassGPerL');
	});
});
