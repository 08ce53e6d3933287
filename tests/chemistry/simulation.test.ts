import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeChemostatSteadyState } from '../../chemistry/chemostat';
import { computeMonodBatchTimeH } from '../../chemistry/productivity';
import {
	computeExhaustionThresholdGPerL,
	defaultOutputEveryH,
	simulateRun,
	type SimulationRequest,
	type SimulationResult
} from '../../chemistry/simulation';

const kinetics = { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 };

function batch(overrides: Partial<SimulationRequest> = {}): SimulationRequest {
	return {
		mode: 'batch',
		kinetics,
		initial: { biomassGPerL: 0.1, substrateGPerL: 20, volumeL: 1 },
		endH: 24,
		outputEveryH: 0.25,
		...overrides
	};
}

function indexAt(result: SimulationResult, tH: number): number {
	const i = result.t.findIndex((t) => Math.abs(t - tH) < 1e-9);
	if (i < 0) throw new Error(`no output at ${tH} h`);
	return i;
}

/** Specific growth rate from the outputs: d ln(X·V)/dt by central differences (no cells leave in fed-batch). */
function growthRatesFromOutputs(r: SimulationResult): { t: number; mu: number }[] {
	const rates: { t: number; mu: number }[] = [];
	for (let i = 1; i < r.t.length - 1; i++) {
		const before = Math.log(r.biomassGPerL[i - 1] * r.volumeL[i - 1]);
		const after = Math.log(r.biomassGPerL[i + 1] * r.volumeL[i + 1]);
		rates.push({ t: r.t[i], mu: (after - before) / (r.t[i + 1] - r.t[i - 1]) });
	}
	return rates;
}

describe('batch', () => {
	it('grows as X0·e^(μmax·t) while S ≫ Ks', () => {
		// Monod 1949: μ = μmax·S/(Ks + S) → μmax for S ≫ Ks, so dX/dt = μmax·X integrates to X0·e^(μmax·t).
		const r = simulateRun(
			batch({
				kinetics: { muMaxPerH: 0.5, ksGPerL: 0.001, yieldXS: 0.5 },
				initial: { biomassGPerL: 0.01, substrateGPerL: 100, volumeL: 1 },
				endH: 10
			})
		);
		expect(r.t.length).toBe(41);
		for (let i = 0; i < r.t.length; i++) {
			// S stays above 97 g/L, so μ is within 1.1e-5 relative of μmax: over μmax·t ≤ 5 that is
			// at most 5.5e-5 in X.
			expect(Math.abs(r.biomassGPerL[i] / (0.01 * Math.exp(0.5 * r.t[i])) - 1)).toBeLessThan(6e-5);
		}
	});

	it('keeps X − X0 = Yx/s·(S0 − S) at every output time without maintenance', () => {
		// Mass balance of the Monod batch with m_s = 0: dX/dt = −Yx/s·dS/dt (Monod 1949).
		const r = simulateRun(batch());
		expect(r.events.some((e) => e.kind === 'substrateExhausted')).toBe(true);
		for (let i = 0; i < r.t.length; i++) {
			expect(r.biomassGPerL[i] - 0.1).toBeCloseTo(0.5 * (20 - r.substrateGPerL[i]), 6);
		}
	});

	it('conserves X + Yx/s·S for any Monod culture without maintenance', () => {
		// Same balance as above (Monod 1949), over random kinetics and starting points.
		fc.assert(
			fc.property(
				fc.record({
					muMaxPerH: fc.double({ min: 0.05, max: 1.5, noNaN: true }),
					ksGPerL: fc.double({ min: 0.01, max: 2, noNaN: true }),
					yieldXS: fc.double({ min: 0.1, max: 0.9, noNaN: true }),
					x0: fc.double({ min: 0.01, max: 2, noNaN: true }),
					s0: fc.double({ min: 0.5, max: 50, noNaN: true })
				}),
				({ muMaxPerH, ksGPerL, yieldXS, x0, s0 }) => {
					const r = simulateRun({
						mode: 'batch',
						kinetics: { muMaxPerH, ksGPerL, yieldXS },
						initial: { biomassGPerL: x0, substrateGPerL: s0, volumeL: 1 },
						endH: 48,
						outputEveryH: 1
					});
					const conserved = x0 + yieldXS * s0;
					expect(r.t.length).toBe(49);
					for (let i = 0; i < r.t.length; i++) {
						const drift = Math.abs(r.biomassGPerL[i] + yieldXS * r.substrateGPerL[i] - conserved);
						expect(drift).toBeLessThanOrEqual(1e-6 * conserved);
					}
				}
			),
			{ numRuns: 15, seed: 7 }
		);
	});

	it('reports exhaustion at the time given by the implicit Monod batch solution', () => {
		// μmax·t = (1 + Ks·Y/A)·ln(X/X0) − (Ks·Y/A)·ln(S/S0), A = X0 + Y·S0 (textbook form, from memory).
		const r = simulateRun(batch());
		const event = r.events.find((e) => e.kind === 'substrateExhausted');
		const sEx = computeExhaustionThresholdGPerL(kinetics.ksGPerL);
		expect(event?.tH).toBeCloseTo(computeMonodBatchTimeH(kinetics, 0.1, 20, sEx), 5);
	});

	it('reports an event already true at the start at t = 0', () => {
		const r = simulateRun(
			batch({ initial: { biomassGPerL: 0.1, substrateGPerL: 0, volumeL: 1 }, endH: 2 })
		);
		expect(r.events.map((e) => [e.kind, e.tH])).toEqual([['substrateExhausted', 0]]);
	});

	it('omits the oxygen series when there is no oxygen block', () => {
		const r = simulateRun(batch());
		expect(r.dissolvedOxygenMgPerL).toBeNull();
		expect(r.ourMmolPerLH).toBeNull();
		expect(r.maxOtrMmolPerLH).toBeNull();
		expect(r.quasiSteadyOxygenH).toBeNull();
		expect(r.tolerances).toEqual({ absolute: 1e-8, relative: 1e-8 });
	});

	it('ends the output grid at endH when endH is not a multiple of outputEveryH', () => {
		const r = simulateRun(batch({ endH: 1, outputEveryH: 0.3 }));
		expect(r.t.map((t) => Number(t.toFixed(9)))).toEqual([0, 0.3, 0.6, 0.9, 1]);
	});

	it('without outputEveryH, outputs on the smallest 1-2-5 step giving at most 2,000 intervals', () => {
		// 336 h / 2000 = 0.168 h: the next round step is 0.2 h, 1,680 intervals.
		expect(defaultOutputEveryH(336)).toBe(0.2);
		expect(defaultOutputEveryH(24)).toBe(0.02);
		expect(defaultOutputEveryH(1)).toBe(0.0005);
		expect(defaultOutputEveryH(2000)).toBe(1);
		expect(defaultOutputEveryH(2001)).toBe(2);
		expect(defaultOutputEveryH(8760)).toBe(5);
		fc.assert(
			fc.property(fc.double({ min: 0.01, max: 20_000, noNaN: true }), (endH) => {
				const step = defaultOutputEveryH(endH);
				expect(endH / step).toBeLessThanOrEqual(2000 * (1 + 1e-9));
				// One notch finer would pass 2,000: 2 → 1, 5 → 2, 1 → 0.5 of the step.
				const finer = String(step).replace(/0*$/, '').endsWith('5') ? step * 0.4 : step * 0.5;
				expect(endH / finer).toBeGreaterThan(2000 * (1 - 1e-9));
			})
		);
		const { outputEveryH: _, ...unset } = batch({ endH: 30 });
		const r = simulateRun(unset);
		expect(r.t).toHaveLength(1501);
		expect(r.t[1]).toBeCloseTo(0.02, 12);
		expect(r.t.at(-1)).toBe(30);
	});

	it('follows Luedeking–Piret product formation', () => {
		// Luedeking & Piret 1959: dP/dt = α·dX/dt + β·X; with β = 0 in a batch, P − P0 = α·(X − X0).
		const r = simulateRun(batch({ kinetics: { ...kinetics, alpha: 0.3 } }));
		for (let i = 0; i < r.t.length; i++) {
			expect(r.productGPerL[i]).toBeCloseTo(0.3 * (r.biomassGPerL[i] - 0.1), 6);
		}
	});
});

describe('oxygen', () => {
	const oxygenBatch = batch({
		kinetics: { ...kinetics, yieldXO2: 1, koMgPerL: 0.2 },
		oxygen: { kLaPerH: 100, saturationMgPerL: 7 },
		endH: 16
	});

	it('reports O2 limitation where DO crosses 5 % of saturation, and OTR in mmol/L/h', () => {
		const r = simulateRun(oxygenBatch);
		const event = r.events.find((e) => e.kind === 'oxygenLimited');
		expect(event).toBeDefined();
		const upTo = simulateRun({ ...oxygenBatch, endH: event!.tH, outputEveryH: event!.tH });
		expect(upTo.dissolvedOxygenMgPerL!.at(-1)).toBeCloseTo(0.05 * 7, 6);
		// O2 = 31.998 g/mol (IUPAC 2021): kLa·C* = 100 /h × 7 mg/L = 700 mg/L/h.
		expect(r.maxOtrMmolPerLH).toBeCloseTo(700 / 31.998, 10);
	});

	it('integrates DO as a state while it is slow: dC/dt = kLa(C* − C) − OUR', () => {
		// Early on DO relaxes at λ ≈ kLa = 100 /h, below 1000·μmax = 500 /h, so it is integrated.
		const r = simulateRun({ ...oxygenBatch, endH: 5, outputEveryH: 0.01 });
		expect(r.quasiSteadyOxygenH).toEqual([]);
		const c = r.dissolvedOxygenMgPerL!;
		// From 0.1 h on: the start-up transient (1/kLa = 36 s) is too fast for a 0.01-h difference.
		for (let i = 10; i < r.t.length - 1; i++) {
			const slope = (c[i + 1] - c[i - 1]) / (r.t[i + 1] - r.t[i - 1]);
			// OUR is reported in mmol/L/h; O2 = 31.998 g/mol (IUPAC 2021).
			const balance = 100 * (7 - c[i]) - r.ourMmolPerLH![i] * 31.998;
			expect(Math.abs(slope - balance)).toBeLessThan(1e-3 * 100 * 7);
		}
		// OUR = 1000·μX/Yx/O2 mg/L/h, μ from Monod 1949 with the O2 factor C/(K_O + C).
		const i = indexAt(r, 4);
		const s = r.substrateGPerL[i];
		const mu = ((0.5 * s) / (0.1 + s)) * (c[i] / (0.2 + c[i]));
		expect(r.ourMmolPerLH![i]).toBeCloseTo((1000 * mu * r.biomassGPerL[i]) / 1 / 31.998, 9);
	});

	it('solves DO at quasi-steady state, kLa(C* − C) = OUR, once it relaxes > 1000·max(μmax, D)', () => {
		const r = simulateRun(oxygenBatch);
		expect(r.quasiSteadyOxygenH!.length).toBeGreaterThan(0);
		const { fromH, toH } = r.quasiSteadyOxygenH![0];
		const inside = r.t.map((t, i) => ({ t, i })).filter(({ t }) => t > fromH && t < toH);
		expect(inside.length).toBeGreaterThan(4);
		for (const { i } of inside) {
			const otr = (100 * (7 - r.dissolvedOxygenMgPerL![i])) / 31.998;
			expect(r.ourMmolPerLH![i] / otr - 1).toBeCloseTo(0, 9);
		}
		// At the switch, λ = kLa + ∂OUR/∂C = kLa + 1000·μmax·S/(Ks + S)·X·K_O/(Yx/O2·(K_O + C)²) = 500 /h.
		// (Stopping just short of the switch, so the reported DO is still the integrated one.)
		const justBefore = fromH - 1e-6;
		const at = simulateRun({ ...oxygenBatch, endH: justBefore, outputEveryH: justBefore });
		expect(at.quasiSteadyOxygenH).toEqual([]);
		const [x, sub, c] = [at.biomassGPerL[1], at.substrateGPerL[1], at.dissolvedOxygenMgPerL![1]];
		const lambda = 100 + (1000 * ((0.5 * sub) / (0.1 + sub)) * x * 0.2) / (1 * (0.2 + c) ** 2);
		expect(lambda / 500 - 1).toBeCloseTo(0, 4);
		// The dynamic DO there is already within a fraction of a per cent of the balance.
		const otr = (100 * (7 - c)) / 31.998;
		expect(Math.abs(at.ourMmolPerLH![1] / otr - 1)).toBeLessThan(0.01);
	});

	it('runs an O2-limited high-density fed-batch, growing at the transfer limit', () => {
		// At O2 limitation all transferred O2 goes to growth (m_O = 0): μX = Yx/O2·kLa(C* − C)/1000, with
		// C near 0 the linear growth of the textbook O2-limited fed-batch (e.g. Shuler & Kargi; from memory).
		const r = simulateRun({
			mode: 'fedBatch',
			kinetics: { muMaxPerH: 0.6, ksGPerL: 0.05, yieldXS: 0.5, yieldXO2: 1, koMgPerL: 0.2 },
			initial: { biomassGPerL: 1, substrateGPerL: 20, volumeL: 1 },
			feed: { strategy: 'constant', substrateGPerL: 500, rateLPerH: 0.02, startH: 6 },
			oxygen: { kLaPerH: 400, saturationMgPerL: 7 },
			endH: 24,
			outputEveryH: 0.1
		});
		const late = growthRatesFromOutputs(r).filter(({ t }) => t >= 15);
		for (const { t, mu } of late) {
			const i = indexAt(r, t);
			const c = r.dissolvedOxygenMgPerL![i];
			expect(c).toBeLessThan(0.05 * 7);
			expect((mu * r.biomassGPerL[i]) / ((1 * 400 * (7 - c)) / 1000) - 1).toBeCloseTo(0, 2);
		}
		expect(r.events.some((e) => e.kind === 'oxygenLimited')).toBe(true);
	});

	it.each([
		// Integrated DO reaches 0 while still falling, so OUR then exceeds kLa·C* by −dC/dt (< 1 %).
		['integrated', 100, 0.01],
		// kLa = 600 /h is above 1000·μmax = 500 /h from the start: DO is quasi-steady until it reaches 0.
		['quasi-steady', 600, 1e-4]
	])(
		'runs on at the transfer limit once DO reaches 0 with no K_O (%s DO)',
		(_balance, kLaPerH, tolerance) => {
			const run = (endH: number, outputEveryH: number) =>
				simulateRun({
					...oxygenBatch,
					kinetics: { ...kinetics, yieldXO2: 1 },
					oxygen: { kLaPerH, saturationMgPerL: 7 },
					endH,
					outputEveryH
				});
			const r = run(oxygenBatch.endH, 0.05);
			expect(r.stoppedAtH).toBeUndefined();
			expect(r.t.at(-1)).toBe(oxygenBatch.endH);
			const depleted = r.events.find((e) => e.kind === 'oxygenDepleted');
			expect(depleted).toBeDefined();
			const tD = depleted!.tH;
			expect(tD).toBeLessThan(16);
			expect(r.oxygenLimitedH![0].fromH).toBe(tD);
			expect(Math.min(...r.dissolvedOxygenMgPerL!)).toBeGreaterThanOrEqual(0);
			// Without K_O growth is unlimited by O2 until DO reaches 0, so X there meets OUR = kLa·C*:
			// μmax·S/(Ks+S)·X·1000/Yx/O2 = kLa·C* (the O2 balance at C = 0).
			const atDepletion = run(tD, tD);
			const xD = atDepletion.biomassGPerL.at(-1)!;
			const sD = atDepletion.substrateGPerL.at(-1)!;
			const demand = 1000 * ((0.5 * sD) / (0.1 + sD)) * xD;
			expect(Math.abs(demand / (kLaPerH * 7) - 1)).toBeLessThan(tolerance);
			// From there OTR = OUR = kLa·C* at DO = 0 (no maintenance), so biomass grows linearly,
			// dX/dt = Yx/O2·kLa·C*/1000, and substrate falls by X/Yx/s (the O2-limited regime of aerobic
			// culture; textbook, from memory) until μmax·S/(Ks + S) falls below what transfer carries and
			// DO rises again.
			const slope = (1 * kLaPerH * 7) / 1000;
			const { toH } = r.oxygenLimitedH![0];
			const limited = r.t.map((t, i) => ({ t, i })).filter(({ t }) => t > tD && t < toH);
			expect(limited.length).toBeGreaterThanOrEqual(4);
			if (toH < oxygenBatch.endH) {
				const atRelease = run(toH, toH);
				const sR = atRelease.substrateGPerL.at(-1)!;
				const growthDemand = 1000 * ((0.5 * sR) / (0.1 + sR)) * atRelease.biomassGPerL.at(-1)!;
				expect(growthDemand / (kLaPerH * 7) - 1).toBeCloseTo(0, 6);
			}
			for (const { t, i } of limited) {
				expect(r.dissolvedOxygenMgPerL![i]).toBe(0);
				expect(r.ourMmolPerLH![i]).toBeCloseTo((kLaPerH * 7) / 31.998, 6);
				expect(r.biomassGPerL[i] / (xD + slope * (t - tD)) - 1).toBeCloseTo(0, 6);
				// Yx/s = 0.5 g/g without maintenance: X − X0 = Yx/s·(S0 − S) holds in every regime.
				expect(r.biomassGPerL[i] - 0.1 - 0.5 * (20 - r.substrateGPerL[i])).toBeCloseTo(0, 6);
			}
		}
	);
});

describe('fed-batch feeding', () => {
	const fed = (
		feed: SimulationRequest['feed'],
		overrides: Partial<SimulationRequest> = {}
	): SimulationRequest => ({
		mode: 'fedBatch',
		kinetics: { muMaxPerH: 0.5, ksGPerL: 0.05, yieldXS: 0.5 },
		initial: { biomassGPerL: 1, substrateGPerL: 0.5, volumeL: 1 },
		feed,
		endH: 60,
		outputEveryH: 0.5,
		...overrides
	});

	it('a constant feed settles into linear growth with d(XV)/dt → F·S_f·Yx/s', () => {
		// Quasi-steady fed-batch (textbook, e.g. Shuler & Kargi 2002, from memory): all fed substrate is
		// turned into biomass, so biomass mass grows linearly at F·S_f·Y.
		const r = simulateRun(fed({ strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.01 }));
		const a = indexAt(r, 50);
		const b = indexAt(r, 60);
		const rate = (r.biomassGPerL[b] * r.volumeL[b] - r.biomassGPerL[a] * r.volumeL[a]) / 10;
		expect(rate / (0.01 * 200 * 0.5) - 1).toBeCloseTo(0, 2);
		// dV/dt = F exactly.
		expect(r.volumeL[b]).toBeCloseTo(1 + 0.01 * 60, 9);
	});

	it('an exponential feed holds μ within 1 % of μset', () => {
		// Exponential feed (textbook form, from memory); S* = Ks·μset/(μmax − μset) from Monod 1949.
		const muSet = 0.2;
		const sStar = (0.05 * muSet) / (0.5 - muSet);
		const r = simulateRun(
			fed(
				{ strategy: 'exponential', substrateGPerL: 300, muSetPerH: muSet },
				{
					kinetics: { muMaxPerH: 0.5, ksGPerL: 0.05, yieldXS: 0.5, maintenanceGPerGH: 0.01 },
					initial: { biomassGPerL: 2, substrateGPerL: sStar, volumeL: 1 },
					endH: 15,
					outputEveryH: 0.1
				}
			)
		);
		for (const { mu } of growthRatesFromOutputs(r))
			expect(Math.abs(mu / muSet - 1)).toBeLessThan(0.01);
		for (const s of r.substrateGPerL) {
			expect(Math.abs((0.5 * s) / (0.05 + s) / muSet - 1)).toBeLessThan(0.01);
		}
	});

	it('a linear ramp adds volume V0 + F0·τ + slope·τ²/2 after its start', () => {
		// ∫(F0 + slope·τ)dτ, with τ = t − startH.
		const r = simulateRun(
			fed(
				{
					strategy: 'linear',
					substrateGPerL: 200,
					rateLPerH: 0.002,
					slopeLPerH2: 0.0005,
					startH: 4
				},
				{ endH: 20 }
			)
		);
		for (let i = 0; i < r.t.length; i++) {
			const tau = Math.max(0, r.t[i] - 4);
			expect(r.volumeL[i]).toBeCloseTo(1 + 0.002 * tau + 0.00025 * tau * tau, 9);
			expect(r.feedLPerH[i]).toBeCloseTo(r.t[i] < 4 ? 0 : 0.002 + 0.0005 * tau, 12);
		}
		expect(r.events.find((e) => e.kind === 'feedStarted')?.tH).toBe(4);
	});

	it('an expression feed matches the built-in law it spells out', () => {
		const linear = simulateRun(
			fed(
				{ strategy: 'linear', substrateGPerL: 200, rateLPerH: 0.002, slopeLPerH2: 0.0005 },
				{ endH: 20 }
			)
		);
		const expression = simulateRun(
			fed(
				{ strategy: 'expression', substrateGPerL: 200, expression: '0.002 + 0.0005 * t' },
				{ endH: 20 }
			)
		);
		for (let i = 0; i < linear.t.length; i++) {
			expect(expression.biomassGPerL[i]).toBeCloseTo(linear.biomassGPerL[i], 9);
			expect(expression.feedLPerH[i]).toBeCloseTo(linear.feedLPerH[i], 12);
		}
	});

	it('an expression feed can read the states', () => {
		const r = simulateRun(
			fed(
				{
					strategy: 'expression',
					substrateGPerL: 200,
					expression: 'min(0.02, 0.001 * X * V / (S + 1))'
				},
				{ endH: 20 }
			)
		);
		for (let i = 0; i < r.t.length; i++) {
			const expected = Math.min(
				0.02,
				(0.001 * r.biomassGPerL[i] * r.volumeL[i]) / (r.substrateGPerL[i] + 1)
			);
			expect(r.feedLPerH[i]).toBeCloseTo(expected, 12);
		}
		expect(r.feedLPerH.some((f) => f > 0)).toBe(true);
	});

	it('a substrate-stat feed holds S at its setpoint, so the culture grows at μ(S_set)', () => {
		// With S fixed, μ = μmax·S_set/(Ks + S_set) (Monod 1949) and X·V grows as e^(μt).
		const r = simulateRun(
			fed(
				{ strategy: 'substrateStat', substrateGPerL: 400, setpointGPerL: 0.02 },
				{ initial: { biomassGPerL: 0.2, substrateGPerL: 2, volumeL: 1 }, endH: 20 }
			)
		);
		const muSet = (0.5 * 0.02) / (0.05 + 0.02);
		const late = r.t.map((t, i) => ({ t, i })).filter(({ t }) => t >= 12);
		for (const { i } of late) expect(r.substrateGPerL[i] / 0.02 - 1).toBeCloseTo(0, 3);
		for (const { t, mu } of growthRatesFromOutputs(r))
			if (t >= 12) expect(mu / muSet - 1).toBeCloseTo(0, 3);
		// While S is above the setpoint the feed stays off.
		expect(r.feedLPerH[0]).toBe(0);
	});

	it('a DO-stat feed caps biomass growth near Yx/O2·kLa·(C* − C_set)', () => {
		// At steady DO, OUR = OTR = kLa(C* − C) and OUR = 1000·μX/Yx/O2 (m_O = 0), so the growth rate per
		// volume μX = Yx/O2·kLa·(C* − C)/1000 (g/L/h); the logistic law holds C within a band of C_set.
		const yieldXO2 = 1;
		const r = simulateRun(
			fed(
				{ strategy: 'doStat', substrateGPerL: 500, doSetpointMgPerL: 2, maxRateLPerH: 0.02 },
				{
					kinetics: { muMaxPerH: 0.5, ksGPerL: 0.05, yieldXS: 0.5, yieldXO2, koMgPerL: 0.1 },
					initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
					oxygen: { kLaPerH: 200, saturationMgPerL: 7 },
					endH: 30,
					outputEveryH: 0.1
				}
			)
		);
		const cap = (yieldXO2 * 200 * (7 - 2)) / 1000;
		const rates = growthRatesFromOutputs(r).filter(({ t }) => t >= 20);
		expect(rates.length).toBeGreaterThan(50);
		for (const { t, mu } of rates) {
			const i = indexAt(r, t);
			const growthPerVolume = mu * r.biomassGPerL[i];
			const doNow = r.dissolvedOxygenMgPerL![i];
			expect(growthPerVolume / ((yieldXO2 * 200 * (7 - doNow)) / 1000) - 1).toBeCloseTo(0, 2);
			expect(Math.abs(growthPerVolume / cap - 1)).toBeLessThan(0.05);
			expect(Math.abs(doNow - 2)).toBeLessThan(0.05 * 7);
		}
	});

	it('stops at the maximum working volume, at the time the feed fills it', () => {
		// V = V0 + bolus + F·(t − startH) reaches Vmax at startH + (Vmax − V0 − bolus)/F.
		const r = simulateRun(
			fed(
				{ strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.1, startH: 2, bolusL: 0.1 },
				{ maxVolumeL: 1.5, endH: 24 }
			)
		);
		expect(r.stoppedAtH).toBeCloseTo(2 + (1.5 - 1 - 0.1) / 0.1, 8);
		expect(r.events.find((e) => e.kind === 'maxVolumeReached')?.tH).toBeCloseTo(r.stoppedAtH!, 12);
		expect(Math.max(...r.volumeL)).toBeLessThanOrEqual(1.5);
		expect(r.volumeL.at(-1)).toBeCloseTo(1.5, 8);
		expect(r.t.at(-1)).toBeCloseTo(r.stoppedAtH!, 9);
		expect(r.t.filter((t) => t > r.stoppedAtH! + 1e-9)).toEqual([]);
	});

	it('mixes a bolus of feed into the culture at the feed start', () => {
		// X·V kept, S·V + S_f·B: X = X0·V0/(V0 + B), S = (S0·V0 + S_f·B)/(V0 + B).
		const r = simulateRun(
			fed(
				{ strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.01, bolusL: 0.25 },
				{ endH: 1, outputEveryH: 1 }
			)
		);
		expect(r.biomassGPerL[0]).toBeCloseTo(1 / 1.25, 12);
		expect(r.substrateGPerL[0]).toBeCloseTo((0.5 + 200 * 0.25) / 1.25, 12);
		expect(r.volumeL[0]).toBeCloseTo(1.25, 12);
	});
});

describe('continuous modes', () => {
	const chemostat = (dilutionPerH: number, endH = 200): SimulationRequest => ({
		mode: 'chemostat',
		kinetics: { muMaxPerH: 0.5, ksGPerL: 0.2, yieldXS: 0.5 },
		initial: { biomassGPerL: 0.5, substrateGPerL: 10, volumeL: 2 },
		feed: { strategy: 'constant', substrateGPerL: 10 },
		dilutionPerH,
		endH,
		outputEveryH: 1
	});

	it('a chemostat converges to the closed-form steady state', () => {
		// Herbert, Elsworth & Telling 1956: S = Ks·D/(μmax − D), X = Y·(S0 − S).
		const r = simulateRun(chemostat(0.3));
		const s = (0.2 * 0.3) / (0.5 - 0.3);
		expect(r.substrateGPerL.at(-1)! / s - 1).toBeCloseTo(0, 6);
		expect(r.biomassGPerL.at(-1)! / (0.5 * (10 - s)) - 1).toBeCloseTo(0, 6);
		const closed = computeChemostatSteadyState({
			muMaxPerH: 0.5,
			ksGPerL: 0.2,
			yieldXS: 0.5,
			feedSubstrateGPerL: 10,
			dilutionPerH: 0.3
		});
		expect(r.biomassGPerL.at(-1)! / closed.biomassGPerL - 1).toBeCloseTo(0, 6);
		expect(r.volumeL.every((v) => v === 2)).toBe(true);
		expect(r.feedLPerH[5]).toBeCloseTo(0.3 * 2, 12);
		expect(r.events.some((e) => e.kind === 'washout')).toBe(false);
	});

	it('washes out above D_crit = μmax·S0/(Ks + S0) and says when', () => {
		// D_crit from Herbert, Elsworth & Telling 1956: 0.5·10/10.2 = 0.490 /h; at D = 0.6 no steady state.
		const r = simulateRun(chemostat(0.6, 100));
		const event = r.events.find((e) => e.kind === 'washout');
		expect(event).toBeDefined();
		const upTo = simulateRun({ ...chemostat(0.6, event!.tH), outputEveryH: event!.tH });
		expect(upTo.biomassGPerL.at(-1)! / (0.01 * 0.5) - 1).toBeCloseTo(0, 5);
	});

	it('starts continuous operation after a batch phase', () => {
		const r = simulateRun({
			...chemostat(0.3, 20),
			feed: { strategy: 'constant', substrateGPerL: 10, startH: 5 }
		});
		expect(r.feedLPerH[indexAt(r, 4)]).toBe(0);
		expect(r.feedLPerH[indexAt(r, 5)]).toBeCloseTo(0.6, 12);
		// Before the start it is a batch: X − X0 = Y(S0 − S).
		expect(r.biomassGPerL[4] - 0.5).toBeCloseTo(0.5 * (10 - r.substrateGPerL[4]), 6);
	});

	it('perfusion with full retention and bleed b settles at μ = b', () => {
		// Cells leave only with the bleed, so steady state needs μ = b: S = Ks·b/(μmax − b) (Monod 1949),
		// and the substrate balance D(S_f − S) = μX/Y gives X = D·Y·(S_f − S)/b (derived).
		const r = simulateRun({
			mode: 'perfusion',
			kinetics: { muMaxPerH: 0.5, ksGPerL: 0.2, yieldXS: 0.5 },
			initial: { biomassGPerL: 0.5, substrateGPerL: 10, volumeL: 1 },
			feed: { strategy: 'constant', substrateGPerL: 10 },
			dilutionPerH: 1,
			perfusion: { retentionEfficiency: 1, bleedPerH: 0.1 },
			endH: 400,
			outputEveryH: 2
		});
		const s = (0.2 * 0.1) / (0.5 - 0.1);
		expect(r.substrateGPerL.at(-1)! / s - 1).toBeCloseTo(0, 5);
		expect(r.biomassGPerL.at(-1)! / ((1 * 0.5 * (10 - s)) / 0.1) - 1).toBeCloseTo(0, 5);
	});

	it('draw-fill scales X by (1 − fraction) and mixes in fresh medium at each draw', () => {
		const fraction = 0.4;
		const request: SimulationRequest = {
			mode: 'drawFill',
			kinetics: { muMaxPerH: 0.5, ksGPerL: 0.2, yieldXS: 0.5 },
			initial: { biomassGPerL: 0.5, substrateGPerL: 10, volumeL: 1 },
			feed: { strategy: 'constant', substrateGPerL: 10 },
			drawFill: { fraction, everyH: 8 },
			endH: 40,
			outputEveryH: 1
		};
		const r = simulateRun(request);
		expect(r.events.filter((e) => e.kind === 'draw').map((e) => e.tH)).toEqual([8, 16, 24, 32]);
		for (const drawH of [8, 16, 24, 32]) {
			// The cycle before the draw is a batch from the previous draw's state.
			const from = indexAt(r, drawH - 8);
			const cycle = simulateRun({
				...request,
				mode: 'batch',
				feed: undefined,
				drawFill: undefined,
				initial: {
					biomassGPerL: r.biomassGPerL[from],
					substrateGPerL: r.substrateGPerL[from],
					volumeL: 1
				},
				endH: 8,
				outputEveryH: 8
			});
			const after = indexAt(r, drawH);
			expect(r.biomassGPerL[after]).toBeCloseTo((1 - fraction) * cycle.biomassGPerL.at(-1)!, 7);
			expect(r.substrateGPerL[after]).toBeCloseTo(
				(1 - fraction) * cycle.substrateGPerL.at(-1)! + fraction * 10,
				7
			);
		}
	});
});
