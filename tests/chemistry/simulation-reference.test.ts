import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { simulateRun, type SimulationRequest } from '../../chemistry/simulation';

/*
 * Reference trajectories from an independent stiff integrator: SciPy's Radau at rtol 1e-10 on the
 * model's equations, with its own event location for exhaustion and O2 limitation. Regenerate with
 *   python3 tests/chemistry/reference/simulation-reference.py > tests/chemistry/reference/simulation-reference.json
 */
interface ReferenceCase {
	name: string;
	note: string;
	request: SimulationRequest;
	t: number[];
	biomassGPerL: number[];
	substrateGPerL: number[];
	volumeL: number[];
	dissolvedOxygenMgPerL: number[] | null;
	regimeChanges: [string, number][];
}

const reference: { integrator: string; cases: ReferenceCase[] } = JSON.parse(
	readFileSync(join(import.meta.dirname, 'reference', 'simulation-reference.json'), 'utf8')
);

/**
 * Agreement within 1 % of the reference value. Substrate below 1 µg/L (1e-6 g/L) is compared
 * absolutely to that floor: no assay reads it, and a relative error of numbers that small says
 * nothing about the culture.
 */
function expectWithinOnePercent(actual: number, expected: number, floor: number, where: string) {
	const error = Math.abs(actual - expected) / Math.max(Math.abs(expected), floor);
	expect(error, where).toBeLessThan(0.01);
}

describe('simulation against an independent stiff integrator (SciPy Radau, rtol 1e-10)', () => {
	it('the fixture came from the committed script', () => {
		expect(reference.integrator).toMatch(/Radau, rtol 1e-10/);
		expect(reference.cases.length).toBeGreaterThanOrEqual(6);
	});

	it.each(reference.cases.map((c) => [c.name, c] as const))(
		'%s: X, S and V within 1 %',
		(_name, c) => {
			const r = simulateRun(c.request);
			expect(r.stoppedAtH).toBeUndefined();
			c.t.forEach((tH, i) => {
				const j = r.t.findIndex((t) => Math.abs(t - tH) < 1e-9);
				expect(j, `output at ${tH} h`).toBeGreaterThanOrEqual(0);
				expectWithinOnePercent(r.biomassGPerL[j], c.biomassGPerL[i], 1e-9, `X at ${tH} h`);
				expectWithinOnePercent(r.substrateGPerL[j], c.substrateGPerL[i], 1e-6, `S at ${tH} h`);
				expectWithinOnePercent(r.volumeL[j], c.volumeL[i], 1e-9, `V at ${tH} h`);
				if (c.dissolvedOxygenMgPerL) {
					// DO within 1 % of saturation: the library may solve it at quasi-steady state (see the model help).
					const cStar = c.request.oxygen!.saturationMgPerL;
					expect(Math.abs(r.dissolvedOxygenMgPerL![j] - c.dissolvedOxygenMgPerL[i])).toBeLessThan(
						0.01 * cStar
					);
				}
			});
		}
	);

	it('a constant feed never carries more biomass than the Pirt ceiling F·S_f/m_s', () => {
		const c = reference.cases.find((k) => k.name.startsWith('constant-feed'))!;
		const { rateLPerH, substrateGPerL } = c.request.feed as {
			rateLPerH: number;
			substrateGPerL: number;
		};
		const ceilingG = (rateLPerH * substrateGPerL) / c.request.kinetics.maintenanceGPerGH!;
		const r = simulateRun(c.request);
		const masses = r.biomassGPerL.map((x, i) => x * r.volumeL[i]);
		expect(Math.max(...masses)).toBeLessThan(ceilingG);
		// Late in the run most of the feed goes to maintenance: X·V is within 10 % of the ceiling (reference: 95 %).
		expect(masses.at(-1)! / ceilingG).toBeGreaterThan(0.9);
		const referenceMass = c.biomassGPerL.at(-1)! * c.volumeL.at(-1)!;
		expect(masses.at(-1)! / referenceMass - 1).toBeCloseTo(0, 3);
	});

	it('the low-dilution chemostat settles on the Pirt steady state X = D·Yx/s·(S0 − S)/(D + m_s·Yx/s)', () => {
		const c = reference.cases.find((k) => k.name.startsWith('chemostat'))!;
		const { muMaxPerH, ksGPerL, yieldXS, maintenanceGPerGH } = c.request.kinetics;
		const d = c.request.dilutionPerH!;
		const s0 = c.request.feed!.substrateGPerL;
		// Pirt (1965), Proc. R. Soc. Lond. B 163:224: S = Ks·D/(μmax − D) is unchanged by maintenance.
		const s = (ksGPerL * d) / (muMaxPerH - d);
		const x = (d * yieldXS * (s0 - s)) / (d + maintenanceGPerGH! * yieldXS);
		const r = simulateRun(c.request);
		expect(r.substrateGPerL.at(-1)! / s - 1).toBeCloseTo(0, 3);
		expect(r.biomassGPerL.at(-1)! / x - 1).toBeCloseTo(0, 3);
		expect(c.biomassGPerL.at(-1)! / x - 1).toBeCloseTo(0, 3);
	});

	it('enters and leaves the limited regimes where the reference does', () => {
		const linear = reference.cases.find((k) => k.name.startsWith('linear feed'))!;
		const leftAtH = linear.regimeChanges.find(([name]) => name === 'leave exhaustion')![1];
		const r = simulateRun({ ...linear.request, outputEveryH: 0.01 });
		// S is held at 0 until the ramp's supply F·S_f/V passes m_s·X, then rises.
		const before = r.t.findIndex((t) => t > leftAtH - 0.02);
		const after = r.t.findIndex((t) => t > leftAtH + 0.05);
		expect(r.substrateGPerL[before]).toBe(0);
		expect(r.substrateGPerL[after]).toBeGreaterThan(0);
		const oxygen = reference.cases.find((k) => k.request.oxygen)!;
		const limited = simulateRun(oxygen.request).oxygenLimitedH!;
		const starts = oxygen.regimeChanges.filter(([name]) => name === 'O2 limit').map(([, t]) => t);
		const ends = oxygen.regimeChanges
			.filter(([name]) => name === 'leave O2 limit')
			.map(([, t]) => t);
		expect(limited.map((l) => l.fromH)).toHaveLength(starts.length);
		limited.forEach((l, k) => {
			expect(Math.abs(l.fromH - starts[k])).toBeLessThan(0.01);
			expect(Math.abs(l.toH - ends[k])).toBeLessThan(0.01);
		});
	});
});
