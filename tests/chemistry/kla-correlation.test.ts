import { describe, expect, it } from 'vitest';
import {
	RUSHTON_POWER_NUMBER,
	fitKlaCorrelation,
	predictKla,
	superficialGasVelocityMPerS,
	ungassedPowerW,
	type KlaPoint
} from '../../chemistry/kla-correlation';
import { computeStudentTQuantile } from '../../chemistry/statistics';
import { errorOf } from './input-error';
import { createNormalSource } from './seeded-normal';

// Van 't Riet (1979), coalescing water: kLa = 0.026·(P/V)^0.4·v_s^0.5, kLa in 1/s (from memory).
const TRUE = { k: 0.026, a: 0.4, b: 0.5 };
const POWERS_W_PER_M3 = [100, 300, 1000, 3000];
const VELOCITIES_M_PER_S = [0.002, 0.005, 0.01];

function grid(noise: () => number = () => 0): KlaPoint[] {
	return POWERS_W_PER_M3.flatMap((pv) =>
		VELOCITIES_M_PER_S.map((vs) => ({
			powerPerVolumeWPerM3: pv,
			superficialVelocityMPerS: vs,
			kLaPerS: TRUE.k * pv ** TRUE.a * vs ** TRUE.b * Math.exp(noise())
		}))
	);
}

/** (XᵀX)⁻¹ of the design [1, ln P/V, ln v_s] by cofactors: an independent route to the SEs. */
function inverseNormalMatrix(points: KlaPoint[]): number[][] {
	const rows = points.map((p) => [
		1,
		Math.log(p.powerPerVolumeWPerM3),
		Math.log(p.superficialVelocityMPerS)
	]);
	const m = [0, 1, 2].map((i) => [0, 1, 2].map((j) => rows.reduce((s, r) => s + r[i] * r[j], 0)));
	const cofactor = (i: number, j: number) => {
		const [r0, r1] = [0, 1, 2].filter((r) => r !== i);
		const [c0, c1] = [0, 1, 2].filter((c) => c !== j);
		return (-1) ** (i + j) * (m[r0][c0] * m[r1][c1] - m[r0][c1] * m[r1][c0]);
	};
	const det = m[0].reduce((s, mij, j) => s + mij * cofactor(0, j), 0);
	return [0, 1, 2].map((i) => [0, 1, 2].map((j) => cofactor(j, i) / det));
}

describe('fitting kLa = K·(P/V)^a·v_s^b', () => {
	it('recovers K, a and b without noise', () => {
		const fit = fitKlaCorrelation(grid());
		expect(Math.abs(fit.k - TRUE.k)).toBeLessThan(1e-9);
		expect(Math.abs(fit.a - TRUE.a)).toBeLessThan(1e-9);
		expect(Math.abs(fit.b - TRUE.b)).toBeLessThan(1e-9);
		expect(fit.rSquared).toBeCloseTo(1, 12);
		expect(fit.degreesOfFreedom).toBe(9);
		for (const p of fit.points) expect(p.predictedKLaPerS / p.kLaPerS).toBeCloseTo(1, 10);
	});

	it('with seeded noise, standard errors as the normal equations give them, and the intervals hold the truth', () => {
		const points = grid(
			(
				(n) => () =>
					0.05 * n()
			)(createNormalSource(7))
		);
		const fit = fitKlaCorrelation(points);
		// Independent: s² = Σ residual²/(n − 3) on ln kLa, SE = √(s²·[(XᵀX)⁻¹]ⱼⱼ), inverse by cofactors.
		const residualSquares = points.reduce((s, p, i) => {
			const predicted = fit.points[i].predictedKLaPerS;
			return s + Math.log(p.kLaPerS / predicted) ** 2;
		}, 0);
		const variance = residualSquares / (points.length - 3);
		const inverse = inverseNormalMatrix(points);
		expect(fit.standardErrors!.lnK).toBeCloseTo(Math.sqrt(variance * inverse[0][0]), 10);
		expect(fit.standardErrors!.a).toBeCloseTo(Math.sqrt(variance * inverse[1][1]), 10);
		expect(fit.standardErrors!.b).toBeCloseTo(Math.sqrt(variance * inverse[2][2]), 10);
		const t = computeStudentTQuantile(0.975, 9);
		expect(fit.intervals95!.a.high - fit.a).toBeCloseTo(t * fit.standardErrors!.a, 12);
		expect(fit.intervals95!.k.low).toBeCloseTo(
			Math.exp(Math.log(fit.k) - t * fit.standardErrors!.lnK),
			12
		);
		expect(fit.intervals95!.k.low).toBeLessThan(TRUE.k);
		expect(fit.intervals95!.k.high).toBeGreaterThan(TRUE.k);
		expect(fit.intervals95!.a.low).toBeLessThan(TRUE.a);
		expect(fit.intervals95!.a.high).toBeGreaterThan(TRUE.a);
		expect(fit.intervals95!.b.low).toBeLessThan(TRUE.b);
		expect(fit.intervals95!.b.high).toBeGreaterThan(TRUE.b);
		expect(fit.rSquared).toBeGreaterThan(0.9);
		expect(fit.rSquared).toBeLessThan(1);
	});

	it('holds the true exponent in about 95 % of seeded data sets', () => {
		// Binomial(200, 0.95): mean 190, sd 3.1, so 180–199 is ±3 sd; seeded, the count never changes.
		let heldA = 0;
		let heldB = 0;
		for (let seed = 1; seed <= 200; seed++) {
			const normal = createNormalSource(seed);
			const { intervals95 } = fitKlaCorrelation(grid(() => 0.1 * normal()));
			if (intervals95!.a.low <= TRUE.a && TRUE.a <= intervals95!.a.high) heldA++;
			if (intervals95!.b.low <= TRUE.b && TRUE.b <= intervals95!.b.high) heldB++;
		}
		for (const held of [heldA, heldB]) {
			expect(held).toBeGreaterThanOrEqual(180);
			expect(held).toBeLessThanOrEqual(199);
		}
	});

	it('fits 3 points exactly and says why there are no intervals', () => {
		const three = [grid()[0], grid()[4], grid()[11]];
		const fit = fitKlaCorrelation(three);
		expect(fit.a).toBeCloseTo(TRUE.a, 9);
		expect(fit.degreesOfFreedom).toBe(0);
		expect(fit.standardErrors).toBeNull();
		expect(fit.intervals95).toBeNull();
		expect(fit.intervalNote).toContain('at least 4 points');
	});

	it('refuses a design that cannot separate P/V from v_s, and too few points', () => {
		const samePower = grid().filter((p) => p.powerPerVolumeWPerM3 === 300);
		expect(errorOf(() => fitKlaCorrelation(samePower)).message).toContain('same P/V');
		const sameVelocity = grid().filter((p) => p.superficialVelocityMPerS === 0.005);
		expect(errorOf(() => fitKlaCorrelation(sameVelocity)).message).toContain(
			'same superficial gas velocity'
		);
		// v_s doubled whenever P/V is: ln v_s = ln P/V + const, a straight line.
		const together = [100, 200, 400, 800].map((pv) => ({
			powerPerVolumeWPerM3: pv,
			superficialVelocityMPerS: pv * 1e-5,
			kLaPerS: 0.01 * (pv / 100)
		}));
		expect(errorOf(() => fitKlaCorrelation(together)).message).toContain('cannot be told apart');
		const two = errorOf(() => fitKlaCorrelation(grid().slice(0, 2)));
		expect([two.field, two.message]).toEqual([
			'points',
			expect.stringContaining('at least 3 measured points')
		]);
		const negative = errorOf(() =>
			fitKlaCorrelation([...grid().slice(0, 3), { ...grid()[3], kLaPerS: -0.01 }])
		);
		expect([negative.field, negative.message]).toEqual([
			'points.3.kLaPerS',
			'Point 4 kLa must be greater than 0, not -0.01'
		]);
	});

	it('predicts kLa and flags a point outside the measured range', () => {
		const fit = fitKlaCorrelation(grid());
		// 0.026 × 500^0.4 × 0.004^0.5 = 0.026 × 12.01124 × 0.0632456 = 0.0197511 1/s = 71.104 1/h.
		const inside = predictKla(fit, 500, 0.004);
		expect(inside.kLaPerS).toBeCloseTo(0.0197511, 7);
		expect(inside.kLaPerH).toBeCloseTo(71.103, 2);
		expect(inside.outsideMeasuredRange).toBe(false);
		const beyond = predictKla(fit, 5000, 0.004);
		expect([beyond.outsideMeasuredRange, beyond.powerPerVolumeOutside]).toEqual([true, true]);
		expect(beyond.superficialVelocityOutside).toBe(false);
		expect(predictKla(fit, 500, 0.001).superficialVelocityOutside).toBe(true);
	});
});

describe('the inputs of a kLa correlation', () => {
	it('ungassed power Np·ρ·N³·D⁵, by hand', () => {
		// Rushton turbine Np 5 (common practice), water 1000 kg/m³, 300 rpm = 5 1/s, D = 0.1 m:
		// 5 × 1000 × 125 × 1e-5 = 6.25 W.
		expect(RUSHTON_POWER_NUMBER).toBe(5);
		expect(
			ungassedPowerW({ speedPerS: 5, impellerDiameterM: 0.1, densityKgPerM3: 1000 })
		).toBeCloseTo(6.25, 12);
		// Np 0.75 (a pitched-blade value someone might enter), 2 1/s, D 0.5 m, 1020 kg/m³:
		// 0.75 × 1020 × 8 × 0.03125 = 191.25 W.
		expect(
			ungassedPowerW({
				powerNumber: 0.75,
				speedPerS: 2,
				impellerDiameterM: 0.5,
				densityKgPerM3: 1020
			})
		).toBeCloseTo(191.25, 10);
		const e = errorOf(() =>
			ungassedPowerW({ speedPerS: 0, impellerDiameterM: 0.1, densityKgPerM3: 1000 })
		);
		expect([e.field, e.message]).toEqual([
			'speedPerS',
			'Stirrer speed must be greater than 0, not 0'
		]);
	});

	it('superficial gas velocity Q/(π·D²/4), by hand', () => {
		// 10 L/min = 1.66667e-4 m³/s through D = 0.2 m (area π × 0.01 = 0.0314159 m²): 5.30516e-3 m/s.
		expect(superficialGasVelocityMPerS({ gasFlowLPerMin: 10, vesselDiameterM: 0.2 })).toBeCloseTo(
			5.30516e-3,
			8
		);
		const e = errorOf(() =>
			superficialGasVelocityMPerS({ gasFlowLPerMin: 10, vesselDiameterM: -1 })
		);
		expect(e.message).toBe('Vessel diameter must be greater than 0, not -1');
	});
});
