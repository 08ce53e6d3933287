import { describe, expect, it } from 'vitest';
import { computeChemostatSteadyState } from '../../chemistry/chemostat';
import {
	compareBatchWithContinuous,
	computeMonodBatchTimeH,
	computeMonodBatchWithMaintenance
} from '../../chemistry/productivity';
import { computeExhaustionThresholdGPerL, simulateRun } from '../../chemistry/simulation';
import { errorOf } from './input-error';
// Independent computation with SciPy on the model's balances (root finding, bounded Brent, DOP853),
// never the library's closed forms. Regenerate from the repository root with:
//   python3 tests/chemistry/reference/chemostat-maintenance.py > tests/chemistry/reference/chemostat-maintenance.json
import scipyReference from './reference/chemostat-maintenance.json';

const culture = { muMaxPerH: 0.5, ksGPerL: 0.2, yieldXS: 0.5, feedSubstrateGPerL: 10 };

/** The dynamic chemostat (μmax 0.5, Ks 0.2, Yx/s 0.5, S0 10 g/L) at D = 0.25 /h, run 300 h to its steady state. */
function simulateChemostatAtQuarterPerHour(maintenanceGPerGH: number) {
	return simulateRun({
		mode: 'chemostat',
		kinetics: { muMaxPerH: 0.5, ksGPerL: 0.2, yieldXS: 0.5, maintenanceGPerGH },
		initial: { biomassGPerL: 0.2, substrateGPerL: 5, volumeL: 1 },
		feed: { strategy: 'constant', substrateGPerL: 10 },
		dilutionPerH: 0.25,
		endH: 300,
		outputEveryH: 10
	});
}

describe('computeChemostatSteadyState', () => {
	it('matches the closed-form steady state', () => {
		// Monod 1949; Herbert, Elsworth & Telling 1956: S = Ks·D/(μmax − D), X = Y(S0 − S).
		const r = computeChemostatSteadyState({ ...culture, dilutionPerH: 0.3 });
		const s = (0.2 * 0.3) / (0.5 - 0.3);
		expect(r.substrateGPerL).toBeCloseTo(s, 12);
		expect(r.biomassGPerL).toBeCloseTo(0.5 * (10 - s), 12);
		expect(r.productivityGPerLH).toBeCloseTo(0.3 * 0.5 * (10 - s), 12);
		expect(r.washout).toBe(false);
		// D_crit = μmax·S0/(Ks + S0); D_opt = μmax(1 − √(Ks/(Ks + S0))) (same sources).
		expect(r.criticalDilutionPerH).toBeCloseTo((0.5 * 10) / 10.2, 12);
		expect(r.optimalDilutionPerH).toBeCloseTo(0.5 * (1 - Math.sqrt(0.2 / 10.2)), 12);
	});

	it('puts D_opt where D·X is greatest', () => {
		// Independent of the closed form: scan D·X = D·Y(S0 − Ks·D/(μmax − D)) on a fine grid.
		const r = computeChemostatSteadyState({ ...culture, dilutionPerH: 0.1 });
		let bestD = 0;
		let best = -Infinity;
		for (let d = 0; d < r.criticalDilutionPerH; d += 1e-6) {
			const p = d * 0.5 * (10 - (0.2 * d) / (0.5 - d));
			if (p > best) [best, bestD] = [p, d];
		}
		expect(r.optimalDilutionPerH).toBeCloseTo(bestD, 5);
		expect(Math.max(...r.sweep.map((p) => p.productivityGPerLH))).toBeLessThanOrEqual(best + 1e-12);
	});

	it('reports washout at and above D_crit', () => {
		const dCrit = (0.5 * 10) / 10.2;
		for (const d of [dCrit, 0.495, 0.6]) {
			const r = computeChemostatSteadyState({ ...culture, dilutionPerH: d });
			expect(r.washout).toBe(true);
			expect(r.biomassGPerL).toBe(0);
			expect(r.substrateGPerL).toBe(10);
		}
	});

	it('sweeps from D = 0 to D_crit', () => {
		const r = computeChemostatSteadyState({ ...culture, dilutionPerH: 0.3, sweepPoints: 51 });
		expect(r.sweep).toHaveLength(51);
		expect(r.sweep[0]).toEqual({
			dilutionPerH: 0,
			biomassGPerL: 5,
			substrateGPerL: 0,
			productivityGPerLH: 0
		});
		expect(r.sweep[50].dilutionPerH).toBeCloseTo(r.criticalDilutionPerH, 12);
		expect(r.sweep[50].biomassGPerL).toBeCloseTo(0, 9);
		for (let i = 1; i < 51; i++)
			expect(r.sweep[i].biomassGPerL).toBeLessThan(r.sweep[i - 1].biomassGPerL);
	});

	it('operates at min((1 − margin)·D_crit, D_opt) and prices the margin against D_opt', () => {
		const closedP = (d: number) => d * 0.5 * (10 - (0.2 * d) / (0.5 - d));
		const dCrit = (0.5 * 10) / 10.2;
		const dOpt = 0.5 * (1 - Math.sqrt(0.2 / 10.2));
		// 0.9·D_crit is above D_opt here: run at D_opt, nothing lost.
		const small = computeChemostatSteadyState({ ...culture, dilutionPerH: 0.3, safetyMargin: 0.1 });
		expect(small.marginDilutionPerH).toBeCloseTo(dOpt, 12);
		expect(small.productivityLostToMargin).toBeCloseTo(0, 12);
		const large = computeChemostatSteadyState({ ...culture, dilutionPerH: 0.3, safetyMargin: 0.3 });
		expect(large.marginDilutionPerH).toBeCloseTo(0.7 * dCrit, 12);
		expect(large.productivityLostToMargin).toBeCloseTo(
			1 - closedP(0.7 * dCrit) / closedP(dOpt),
			12
		);
	});

	it('agrees with the dynamic simulation at steady state', () => {
		const steady = computeChemostatSteadyState({ ...culture, dilutionPerH: 0.25 });
		const run = simulateChemostatAtQuarterPerHour(0);
		expect(run.substrateGPerL.at(-1)! / steady.substrateGPerL - 1).toBeCloseTo(0, 6);
		expect(run.biomassGPerL.at(-1)! / steady.biomassGPerL - 1).toBeCloseTo(0, 6);
	});

	it('names the bad field', () => {
		expect(
			errorOf(() => computeChemostatSteadyState({ ...culture, muMaxPerH: 0, dilutionPerH: 0.1 }))
				.field
		).toBe('muMaxPerH');
		expect(
			errorOf(() => computeChemostatSteadyState({ ...culture, dilutionPerH: -0.1 })).field
		).toBe('dilutionPerH');
		expect(
			errorOf(() => computeChemostatSteadyState({ ...culture, dilutionPerH: 0.1, safetyMargin: 1 }))
				.field
		).toBe('safetyMargin');
		expect(
			errorOf(() =>
				computeChemostatSteadyState({
					...culture,
					feedSubstrateGPerL: Number.NaN,
					dilutionPerH: 0.1
				})
			).field
		).toBe('feedSubstrateGPerL');
	});
});

/** |actual/expected − 1|, so a check reads as a relative tolerance */
const relativeError = (actual: number, expected: number) => Math.abs(actual / expected - 1);

describe('computeChemostatSteadyState with Pirt maintenance', () => {
	const cultures = Object.entries(scipyReference.chemostat);

	it('drops the biomass by a third at m_s = 0.05 g/g/h, D = 0.05 /h, Y_G = 0.5', () => {
		// Pirt 1965 (Proc. R. Soc. Lond. B 163:224): X = D·Y_G(S0 − S)/(D + m_s·Y_G), so X/X(m_s = 0) =
		// D/(D + m_s·Y_G) = 0.05/(0.05 + 0.025) = 2/3, worked by hand.
		const base = {
			muMaxPerH: 0.6,
			ksGPerL: 0.05,
			yieldXS: 0.5,
			feedSubstrateGPerL: 20,
			dilutionPerH: 0.05
		};
		const without = computeChemostatSteadyState(base);
		const withMaintenance = computeChemostatSteadyState({ ...base, maintenanceGPerGH: 0.05 });
		expect(withMaintenance.biomassGPerL / without.biomassGPerL).toBeCloseTo(2 / 3, 12);
		// S depends only on μ(S) = D (Monod 1949), so maintenance leaves it as it was.
		expect(withMaintenance.substrateGPerL).toBe(without.substrateGPerL);
	});

	for (const [name, reference] of cultures) {
		it(`matches SciPy's steady states, D_crit and D_opt (${name})`, () => {
			const { input } = reference;
			for (const point of reference.points) {
				const r = computeChemostatSteadyState({ ...input, dilutionPerH: point.dilutionPerH });
				// SciPy brentq on μ(S) = D, then the substrate balance (chemostat-maintenance.json).
				expect(relativeError(r.substrateGPerL, point.substrateGPerL)).toBeLessThan(1e-9);
				expect(relativeError(r.biomassGPerL, point.biomassGPerL)).toBeLessThan(1e-9);
				expect(relativeError(r.productivityGPerLH, point.productivityGPerLH)).toBeLessThan(1e-9);
				expect(r.washout).toBe(point.washout);
			}
			const r = computeChemostatSteadyState({
				...input,
				dilutionPerH: reference.points[0].dilutionPerH
			});
			// SciPy: μ(S0) = D, the largest D with a steady state X > 0 (chemostat-maintenance.json).
			expect(relativeError(r.criticalDilutionPerH, reference.criticalDilutionPerH)).toBeLessThan(
				1e-12
			);
			// SciPy: bounded Brent on −D·X refined by brentq on the slope (chemostat-maintenance.json);
			// the golden section here is limited by the flat top to about √ε.
			expect(relativeError(r.optimalDilutionPerH, reference.optimalDilutionPerH)).toBeLessThan(
				1e-7
			);
			const atOptimum = computeChemostatSteadyState({
				...input,
				dilutionPerH: r.optimalDilutionPerH
			});
			expect(
				relativeError(atOptimum.productivityGPerLH, reference.optimalProductivityGPerLH)
			).toBeLessThan(1e-12);
		});
	}

	it('moves D_opt towards D_crit as maintenance grows, and tends to the closed form as m_s → 0', () => {
		const culture10 = { ...culture, dilutionPerH: 0.3 };
		// D_opt without maintenance: μmax(1 − √(Ks/(Ks + S0))) (Herbert, Elsworth & Telling 1956).
		const closedForm = 0.5 * (1 - Math.sqrt(0.2 / 10.2));
		const tiny = computeChemostatSteadyState({ ...culture10, maintenanceGPerGH: 1e-9 });
		expect(relativeError(tiny.optimalDilutionPerH, closedForm)).toBeLessThan(1e-6);
		const optima = [0.01, 0.05, 0.2].map(
			(m) => computeChemostatSteadyState({ ...culture10, maintenanceGPerGH: m }).optimalDilutionPerH
		);
		expect(optima[0]).toBeGreaterThan(closedForm);
		expect(optima[1]).toBeGreaterThan(optima[0]);
		expect(optima[2]).toBeGreaterThan(optima[1]);
		expect(optima[2]).toBeLessThan(tiny.criticalDilutionPerH);
	});

	it('puts D_opt at the top of a dense grid of D·X computed from the balances', () => {
		// A second method: D·X on a grid of 10⁶ points, X from the substrate balance
		// D(S0 − S) = (D/Y_G + m_s)X (Pirt 1965) with S = Ks·D/(μmax − D) (Monod 1949).
		const m = 0.1;
		const r = computeChemostatSteadyState({ ...culture, dilutionPerH: 0.1, maintenanceGPerGH: m });
		let bestD = 0;
		let best = -Infinity;
		const steps = 1_000_000;
		for (let i = 1; i < steps; i++) {
			const d = (r.criticalDilutionPerH * i) / steps;
			const s = (0.2 * d) / (0.5 - d);
			const p = (d * d * (10 - s)) / (d / 0.5 + m);
			if (p > best) [best, bestD] = [p, d];
		}
		expect(Math.abs(r.optimalDilutionPerH - bestD)).toBeLessThan(r.criticalDilutionPerH / steps);
		expect(Math.max(...r.sweep.map((p) => p.productivityGPerLH))).toBeLessThanOrEqual(best + 1e-12);
	});

	it('sweeps from D = 0, where maintenance takes all the substrate, to D_crit', () => {
		const r = computeChemostatSteadyState({
			...culture,
			dilutionPerH: 0.3,
			maintenanceGPerGH: 0.05,
			sweepPoints: 11
		});
		// X = D·Y_G(S0 − S)/(D + m_s·Y_G) is 0 at D = 0 and at D_crit (Pirt 1965).
		expect(r.sweep[0]).toEqual({
			dilutionPerH: 0,
			biomassGPerL: 0,
			substrateGPerL: 0,
			productivityGPerLH: 0
		});
		expect(r.sweep[10].biomassGPerL).toBeCloseTo(0, 9);
		const d = r.sweep[5].dilutionPerH;
		const s = (0.2 * d) / (0.5 - d);
		expect(r.sweep[5].biomassGPerL).toBeCloseTo((d * 0.5 * (10 - s)) / (d + 0.05 * 0.5), 12);
	});

	it('prices the safety margin against the D_opt with maintenance', () => {
		const reference = scipyReference.chemostat.slowerCulture;
		const r = computeChemostatSteadyState({
			...reference.input,
			dilutionPerH: 0.1,
			safetyMargin: 0.3
		});
		const dMargin = 0.7 * reference.criticalDilutionPerH;
		expect(r.marginDilutionPerH).toBeCloseTo(dMargin, 12);
		// D·X at the margin from the balances (Pirt 1965), against SciPy's optimum (chemostat-maintenance.json).
		const s = (0.2 * dMargin) / (0.5 - dMargin);
		const atMargin = (dMargin * dMargin * (10 - s)) / (dMargin / 0.5 + 0.1);
		expect(r.productivityLostToMargin).toBeCloseTo(
			1 - atMargin / reference.optimalProductivityGPerLH,
			9
		);
	});

	it('agrees with the dynamic simulation with maintenance at steady state', () => {
		// The integrator (RODAS) reaches the steady state of the same balances, maintenance in full.
		const m = 0.05;
		const steady = computeChemostatSteadyState({
			...culture,
			dilutionPerH: 0.25,
			maintenanceGPerGH: m
		});
		const run = simulateChemostatAtQuarterPerHour(m);
		expect(run.substrateGPerL.at(-1)! / steady.substrateGPerL - 1).toBeCloseTo(0, 6);
		expect(run.biomassGPerL.at(-1)! / steady.biomassGPerL - 1).toBeCloseTo(0, 6);
	});

	it('leaves every result exactly as before when m_s is 0', () => {
		const plain = computeChemostatSteadyState({ ...culture, dilutionPerH: 0.3, safetyMargin: 0.3 });
		const zero = computeChemostatSteadyState({
			...culture,
			dilutionPerH: 0.3,
			safetyMargin: 0.3,
			maintenanceGPerGH: 0
		});
		expect(zero).toEqual(plain);
	});

	it('names maintenanceGPerGH when it is negative or not a number', () => {
		for (const bad of [-0.01, Number.NaN, Number.POSITIVE_INFINITY]) {
			expect(
				errorOf(() =>
					computeChemostatSteadyState({ ...culture, dilutionPerH: 0.1, maintenanceGPerGH: bad })
				).field
			).toBe('maintenanceGPerGH');
		}
	});
});

describe('compareBatchWithContinuous', () => {
	const input = {
		muMaxPerH: 0.5,
		ksGPerL: 0.2,
		yieldXS: 0.5,
		substrateGPerL: 10,
		inoculumGPerL: 0.1,
		dilutionPerH: 0.4,
		turnaround: { cleaningH: 2, sterilisingH: 1.5, fillingH: 1, lagH: 2.5 }
	};

	it('times the batch by the implicit Monod solution, as the integrator finds it', () => {
		// Convert to the simulation's exhaustion threshold so the batch time equals its event time.
		const sEx = computeExhaustionThresholdGPerL(0.2);
		const r = compareBatchWithContinuous({ ...input, conversion: 1 - sEx / 10 });
		const run = simulateRun({
			mode: 'batch',
			kinetics: { muMaxPerH: 0.5, ksGPerL: 0.2, yieldXS: 0.5 },
			initial: { biomassGPerL: 0.1, substrateGPerL: 10, volumeL: 1 },
			endH: 30,
			outputEveryH: 1
		});
		const exhausted = run.events.find((e) => e.kind === 'substrateExhausted')!;
		expect(r.batch.growthTimeH).toBeCloseTo(exhausted.tH, 5);
		expect(r.batch.turnaroundH).toBe(7);
	});

	it('divides batch biomass by cycle time and compares with D·X', () => {
		// Batch productivity (X_end − X0)/(t_batch + t_turnaround); chemostat D·X (textbook, from memory).
		const r = compareBatchWithContinuous(input);
		const sEnd = 0.01 * 10;
		const tBatch = computeMonodBatchTimeH(input, 0.1, 10, sEnd);
		const batchP = (0.5 * (10 - sEnd)) / (tBatch + 7);
		const s = (0.2 * 0.4) / (0.5 - 0.4);
		const continuousP = 0.4 * 0.5 * (10 - s);
		expect(r.batch.productivityGPerLH).toBeCloseTo(batchP, 12);
		expect(r.continuous.productivityGPerLH).toBeCloseTo(continuousP, 12);
		expect(r.continuousToBatchRatio).toBeCloseTo(continuousP / batchP, 10);
	});

	it('approaches ln(Xm/X0) + μmax·t_turnaround with Ks ≪ S0 and D near μmax', () => {
		// Textbook estimate of the best continuous/batch ratio (e.g. Shuler & Kargi 2002; from memory).
		const r = compareBatchWithContinuous({
			...input,
			ksGPerL: 1e-6,
			dilutionPerH: 0.4995,
			conversion: 0.999999
		});
		const estimate = Math.log((0.1 + 0.5 * 10) / 0.1) + 0.5 * 7;
		expect(r.textbookRatioEstimate).toBeCloseTo(estimate, 12);
		expect(Math.abs(r.continuousToBatchRatio / estimate - 1)).toBeLessThan(0.01);
	});

	it('gives no continuous productivity past washout', () => {
		const r = compareBatchWithContinuous({ ...input, dilutionPerH: 0.6 });
		expect(r.continuous.washout).toBe(true);
		expect(r.continuousToBatchRatio).toBe(0);
	});

	it('carries maintenance into the batch and the chemostat alike', () => {
		const reference = scipyReference.batch.testCulture;
		const m = reference.input.maintenanceGPerGH;
		const r = compareBatchWithContinuous({ ...input, maintenanceGPerGH: m });
		// Batch: SciPy solve_ivp (DOP853) of dX/dt = μX, dS/dt = −(μ/Y_G + m_s)X to S = 0.01·S0
		// (chemostat-maintenance.json).
		expect(relativeError(r.batch.growthTimeH, reference.growthTimeH)).toBeLessThan(1e-8);
		expect(relativeError(r.batch.finalBiomassGPerL, reference.finalBiomassGPerL)).toBeLessThan(
			1e-8
		);
		expect(r.batch.productivityGPerLH).toBeCloseTo(
			(reference.finalBiomassGPerL - 0.1) / (reference.growthTimeH + 7),
			9
		);
		// Chemostat: X = D·Y_G(S0 − S)/(D + m_s·Y_G) (Pirt 1965), by hand at D = 0.4.
		const s = (0.2 * 0.4) / (0.5 - 0.4);
		const x = (0.4 * 0.5 * (10 - s)) / (0.4 + m * 0.5);
		expect(r.continuous.biomassGPerL).toBeCloseTo(x, 12);
		expect(r.continuous.productivityGPerLH).toBeCloseTo(0.4 * x, 12);
		expect(r.continuousToBatchRatio).toBeCloseTo(
			r.continuous.productivityGPerLH / r.batch.productivityGPerLH,
			12
		);
	});

	it('integrates the batch with maintenance as SciPy does for the page defaults too', () => {
		const { input: b, growthTimeH, finalBiomassGPerL } = scipyReference.batch.pageDefaults;
		const r = computeMonodBatchWithMaintenance(
			b,
			b.inoculumGPerL,
			b.substrateGPerL,
			(1 - b.conversion) * b.substrateGPerL
		);
		// SciPy solve_ivp DOP853 with a terminal event (chemostat-maintenance.json).
		expect(relativeError(r.growthTimeH, growthTimeH)).toBeLessThan(1e-8);
		expect(relativeError(r.biomassGPerL, finalBiomassGPerL)).toBeLessThan(1e-8);
	});

	it('tends to the batch without maintenance as m_s → 0', () => {
		// Closed-form Monod batch (textbook form, from memory) against the integration at a tiny m_s.
		const r = computeMonodBatchWithMaintenance(
			{ ...input, maintenanceGPerGH: 1e-12 },
			0.1,
			10,
			0.1
		);
		expect(relativeError(r.growthTimeH, computeMonodBatchTimeH(input, 0.1, 10, 0.1))).toBeLessThan(
			1e-8
		);
		expect(relativeError(r.biomassGPerL, 0.1 + 0.5 * 9.9)).toBeLessThan(1e-8);
	});

	it('names the bad field', () => {
		expect(
			errorOf(() => compareBatchWithContinuous({ ...input, maintenanceGPerGH: -1 })).field
		).toBe('maintenanceGPerGH');
		expect(errorOf(() => compareBatchWithContinuous({ ...input, inoculumGPerL: 0 })).field).toBe(
			'inoculumGPerL'
		);
		expect(errorOf(() => compareBatchWithContinuous({ ...input, substrateGPerL: -1 })).field).toBe(
			'substrateGPerL'
		);
		expect(
			errorOf(() => compareBatchWithContinuous({ ...input, turnaround: { cleaningH: -1 } })).field
		).toBe('turnaround.cleaningH');
		expect(errorOf(() => compareBatchWithContinuous({ ...input, conversion: 1 })).field).toBe(
			'conversion'
		);
	});
});
