import { describe, expect, it } from 'vitest';
import { computeChemostatSteadyState } from '../../chemistry/chemostat';
import { compareBatchWithContinuous, computeMonodBatchTimeH } from '../../chemistry/productivity';
import { computeExhaustionThresholdGPerL, simulateRun } from '../../chemistry/simulation';
import { errorOf } from './input-error';

const culture = { muMaxPerH: 0.5, ksGPerL: 0.2, yieldXS: 0.5, feedSubstrateGPerL: 10 };

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
		const run = simulateRun({
			mode: 'chemostat',
			kinetics: { muMaxPerH: 0.5, ksGPerL: 0.2, yieldXS: 0.5 },
			initial: { biomassGPerL: 0.2, substrateGPerL: 5, volumeL: 1 },
			feed: { strategy: 'constant', substrateGPerL: 10 },
			dilutionPerH: 0.25,
			endH: 300,
			outputEveryH: 10
		});
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

	it('names the bad field', () => {
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
