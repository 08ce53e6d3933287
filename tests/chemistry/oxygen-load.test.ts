import { describe, expect, it } from 'vitest';
import { findPeakOxygenLoad, roundUpToSignificant } from '../../chemistry/oxygen-load';
import { simulateRun, type SimulationRequest } from '../../chemistry/simulation';

describe('the peak oxygen load of a run', () => {
	it('finds the peak OUR and, apart from it, the peak of OUR·V that the heat follows', () => {
		// Hand-made series: OUR levels off at 100 while the volume keeps growing.
		const peak = findPeakOxygenLoad({
			t: [0, 1, 2, 3],
			ourMmolPerLH: [10, 100, 90, 80],
			volumeL: [1, 1, 1.5, 2]
		});
		expect(peak.peakOurMmolPerLH).toBe(100);
		expect(peak.peakOurAtH).toBe(1);
		expect(peak.peakUptakeMmolPerH).toBe(160);
		expect(peak.peakUptakeAtH).toBe(3);
		expect([peak.peakUptakeOurMmolPerLH, peak.peakUptakeVolumeL]).toEqual([80, 2]);
	});

	it('up to a time between two points, with OUR and V interpolated there', () => {
		const series = { t: [0, 1, 2, 3], ourMmolPerLH: [10, 20, 40, 80], volumeL: [1, 1, 2, 2] };
		// At 1.5 h, halfway: OUR (20 + 40)/2 = 30, V 1.5, so OUR·V 45.
		const peak = findPeakOxygenLoad(series, 1.5);
		expect([peak.peakOurMmolPerLH, peak.peakOurAtH]).toEqual([30, 1.5]);
		expect(peak.peakUptakeMmolPerH).toBe(45);
		expect(findPeakOxygenLoad(series, 10).peakOurMmolPerLH).toBe(80);
	});

	it('rounds a requirement up, so the figure typed back in still meets it', () => {
		expect(roundUpToSignificant(628.3)).toBe(629);
		expect(roundUpToSignificant(630)).toBe(630);
		expect(roundUpToSignificant(0.2731)).toBe(0.274);
		expect(roundUpToSignificant(0.274)).toBe(0.274);
		expect(roundUpToSignificant(5.2301)).toBe(5.24);
		for (const value of [0.20946, 1.005, 12.3456, 999.01, 1234.5]) {
			const up = roundUpToSignificant(value);
			expect(up).toBeGreaterThanOrEqual(value);
			expect(up / value - 1).toBeLessThan(0.01);
		}
	});
});

describe('the O2 demand of a run whose growth oxygen never holds back', () => {
	const base: SimulationRequest = {
		mode: 'batch',
		kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5, maintenanceGPerGH: 0.01, yieldXO2: 1 },
		initial: { biomassGPerL: 0.1, substrateGPerL: 20, volumeL: 1 },
		endH: 16,
		outputEveryH: 0.25
	};

	it('without an oxygen block, OUR is 1000·μ·X/Yx/O2 over O2 = 31.998 g/mol (IUPAC 2021)', () => {
		const r = simulateRun(base);
		expect(r.dissolvedOxygenMgPerL).toBeNull();
		r.t.forEach((_, i) => {
			const s = r.substrateGPerL[i];
			const mu = s > 0 ? (0.5 * s) / (0.1 + s) : 0;
			expect(r.ourMmolPerLH![i]).toBeCloseTo((1000 * mu * r.biomassGPerL[i]) / 1 / 31.998, 6);
		});
	});

	it('with limitsGrowth false, DO is followed and held at 0 but growth is that of the run without oxygen', () => {
		const free = simulateRun(base);
		const followed = simulateRun({
			...base,
			oxygen: { kLaPerH: 100, saturationMgPerL: 7, limitsGrowth: false }
		});
		expect(followed.oxygenLimitedH!.length).toBeGreaterThan(0);
		followed.t.forEach((_, i) => {
			expect(followed.biomassGPerL[i] / free.biomassGPerL[i] - 1).toBeCloseTo(0, 6);
			expect(followed.dissolvedOxygenMgPerL![i]).toBeGreaterThanOrEqual(0);
		});
		const { fromH, toH } = followed.oxygenLimitedH![0];
		const inside = followed.t.findIndex((t) => t > fromH && t < toH);
		expect(followed.dissolvedOxygenMgPerL![inside]).toBe(0);
		// The demand there is beyond what kLa·C* = 700 mg/L/h could supply.
		expect(followed.ourMmolPerLH![inside]).toBeGreaterThan(700 / 31.998);
		const held = simulateRun({ ...base, oxygen: { kLaPerH: 100, saturationMgPerL: 7 } });
		expect(held.biomassGPerL.at(-1)!).toBeLessThan(free.biomassGPerL.at(-1)! * 0.99);
	});

	it('refuses K_O with limitsGrowth false, naming the field', () => {
		expect(() =>
			simulateRun({
				...base,
				kinetics: { ...base.kinetics, koMgPerL: 0.1 },
				oxygen: { kLaPerH: 100, saturationMgPerL: 7, limitsGrowth: false }
			})
		).toThrow(/^K_O slows growth as DO falls/);
	});
});
