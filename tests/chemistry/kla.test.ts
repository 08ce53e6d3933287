import { describe, expect, it } from 'vitest';
import {
	analyseDynamicMethod,
	computeRemainingDeficitFraction,
	fitGassingOut,
	type GassingOutFit
} from '../../chemistry/kla';
import { O2_MOLAR_MASS_G_PER_MOL } from '../../chemistry/oxygen-saturation';
import { createNormalSource } from './seeded-normal';
import { errorOf } from './input-error';

const TRUE_KLA_PER_H = 80;
const TRUE_KLA_PER_S = TRUE_KLA_PER_H / 3600;
const SATURATION_PERCENT = 100;
const INITIAL_PERCENT = 5;
/** 1 s sampling over 4/kLa (180 s at 80 /h) */
const TIMES_S = Array.from({ length: 181 }, (_, i) => i);

/** The liquid's DO in a gassing-out test: C* − (C* − C0)·e^(−kLa·t) (the model itself, no fit). */
function liquidPercent(kLaPerS: number, tS: number): number {
	return SATURATION_PERCENT - (SATURATION_PERCENT - INITIAL_PERCENT) * Math.exp(-kLaPerS * tS);
}

/**
 * The probe's reading, by integrating dCp/dt = (C − Cp)/τp with explicit Euler steps of 1 ms from
 * Cp(0) = C0: an independent computation of what the closed form claims.
 */
function integrateProbePercent(kLaPerS: number, tauS: number, timesS: number[]): number[] {
	const stepS = 1e-3;
	const readings: number[] = [];
	let probe = INITIAL_PERCENT;
	let t = 0;
	for (const target of timesS) {
		while (t < target - stepS / 2) {
			probe += (stepS * (liquidPercent(kLaPerS, t) - probe)) / tauS;
			t += stepS;
		}
		readings.push(probe);
	}
	return readings;
}

function withRelativeNoise(values: number[], seed: number, relative: number): number[] {
	const normal = createNormalSource(seed);
	return values.map((v) => Math.max(0, v * (1 + relative * normal())));
}

function holdsKla(fit: GassingOutFit, kLaPerH: number): boolean {
	return (
		(fit.kLaPerH.lower95 ?? -Infinity) <= kLaPerH && kLaPerH <= (fit.kLaPerH.upper95 ?? Infinity)
	);
}

describe('fitGassingOut without probe lag', () => {
	const clean = TIMES_S.map((t) => liquidPercent(TRUE_KLA_PER_S, t));

	it('returns kLa, C* and C0 from noise-free data', () => {
		const fit = fitGassingOut({ timeS: TIMES_S, dissolvedOxygen: clean });
		// check values: the parameters the data were made from
		expect(fit.kLaPerH.value).toBeCloseTo(TRUE_KLA_PER_H, 6);
		expect(fit.kLaPerS.value).toBeCloseTo(TRUE_KLA_PER_S, 9);
		expect(fit.saturation.value).toBeCloseTo(SATURATION_PERCENT, 6);
		expect(fit.initial.value).toBeCloseTo(INITIAL_PERCENT, 6);
		expect(fit.rSquared).toBeCloseTo(1, 9);
		expect(fit.residuals).toHaveLength(TIMES_S.length);
		expect(fit.curve.timeS[0]).toBe(0);
		expect(fit.curve.timeS.at(-1)).toBe(180);
		expect(fit.warnings.some((w) => w.includes('No probe time constant'))).toBe(true);
	});

	it('holds the true kLa in its 95 % interval in at least 90 % of 50 noisy replicates', () => {
		let held = 0;
		for (let seed = 1; seed <= 50; seed++) {
			const fit = fitGassingOut({
				timeS: TIMES_S,
				dissolvedOxygen: withRelativeNoise(clean, seed, 0.02)
			});
			if (holdsKla(fit, TRUE_KLA_PER_H)) held++;
			expect(fit.kLaPerH.standardError).toBeGreaterThan(0);
		}
		expect(held).toBeGreaterThanOrEqual(45);
	});

	it('warns when the readings stop before a plateau', () => {
		const early = TIMES_S.slice(0, 60);
		const fit = fitGassingOut({
			timeS: early,
			dissolvedOxygen: withRelativeNoise(clean.slice(0, 60), 7, 0.02)
		});
		expect(fit.warnings.some((w) => w.includes('do not reach a plateau'))).toBe(true);
	});

	it('fits from startS on, timing the rise from startS', () => {
		const timeS = [...[-20, -10], ...TIMES_S.map((t) => t + 30)];
		const dissolvedOxygen = [INITIAL_PERCENT, INITIAL_PERCENT, ...clean];
		const fit = fitGassingOut({ timeS, dissolvedOxygen, startS: 30 });
		expect(fit.pointsUsed).toBe(TIMES_S.length);
		expect(fit.kLaPerH.value).toBeCloseTo(TRUE_KLA_PER_H, 6);
		expect(fit.curve.timeS[0]).toBe(30);
	});
});

describe('first-order probe lag', () => {
	const tauS = 5;

	it('the closed form agrees with the integrated probe equation, also at kLa·τp = 1', () => {
		for (const kLaPerS of [TRUE_KLA_PER_S, 1 / tauS, 0.5]) {
			const integrated = integrateProbePercent(kLaPerS, tauS, TIMES_S);
			TIMES_S.forEach((t, i) => {
				const closed =
					SATURATION_PERCENT -
					(SATURATION_PERCENT - INITIAL_PERCENT) *
						computeRemainingDeficitFraction(kLaPerS, tauS, t);
				// Euler with 1 ms steps is first-order accurate: errors of order 1e-3 of the deficit
				expect(Math.abs(closed - integrated[i])).toBeLessThan(0.02);
			});
		}
		// continuity through kLa·τp = 1, where the closed form's first expression is 0/0
		const atOne = computeRemainingDeficitFraction(1 / tauS, tauS, 7);
		expect(atOne).toBeCloseTo((1 + 7 / tauS) * Math.exp(-7 / tauS), 12);
		expect(computeRemainingDeficitFraction((1 + 1e-9) / tauS, tauS, 7)).toBeCloseTo(atOne, 8);
	});

	it('recovers kLa with τp entered; without it kLa comes out too low', () => {
		const integrated = integrateProbePercent(TRUE_KLA_PER_S, tauS, TIMES_S);
		for (const seed of [11, 12, 13]) {
			const dissolvedOxygen = withRelativeNoise(integrated, seed, 0.02);
			const withLag = fitGassingOut({ timeS: TIMES_S, dissolvedOxygen, probeTimeConstantS: tauS });
			expect(holdsKla(withLag, TRUE_KLA_PER_H)).toBe(true);
			const withoutLag = fitGassingOut({ timeS: TIMES_S, dissolvedOxygen });
			expect(withoutLag.kLaPerH.upper95 ?? Infinity).toBeLessThan(TRUE_KLA_PER_H);
			expect(withoutLag.kLaPerH.value).toBeLessThan(withLag.kLaPerH.value);
		}
	});

	it('warns when τp is not small against 1/kLa', () => {
		const fast = 0.5; // 1/kLa = 2 s, τp = 5 s
		const dissolvedOxygen = integrateProbePercent(fast, tauS, TIMES_S.slice(0, 60));
		const fit = fitGassingOut({
			timeS: TIMES_S.slice(0, 60),
			dissolvedOxygen,
			probeTimeConstantS: tauS
		});
		expect(fit.kLaPerS.value).toBeCloseTo(fast, 2);
		expect(fit.warnings.some((w) => w.includes('not small against 1/kLa'))).toBe(true);
	});
});

describe('analyseDynamicMethod', () => {
	// invented run: C* 7 mg/L, kLa 60 /h, OUR 150 mg/L/h, so the DO holds at C∞ = 7 − 150/60 = 4.5 mg/L
	const saturationMgPerL = 7;
	const kLaPerH = 60;
	const ourMgPerLH = 150;
	const steadyMgPerL = saturationMgPerL - ourMgPerLH / kLaPerH;
	const offTimeS = Array.from({ length: 31 }, (_, i) => i);
	const offClean = offTimeS.map((t) => steadyMgPerL - (ourMgPerLH / 3600) * t);
	const lowestMgPerL = offClean.at(-1) as number;
	const onTimeS = Array.from({ length: 151 }, (_, i) => 31 + 2 * i);
	const onClean = onTimeS.map(
		(t) => steadyMgPerL - (steadyMgPerL - lowestMgPerL) * Math.exp((-kLaPerH / 3600) * (t - 31))
	);
	const withNoise = (values: number[], seed: number) => {
		const normal = createNormalSource(seed);
		return values.map((v) => v + 0.02 * normal());
	};

	it('recovers OUR, kLa and C* from gas-off and gas-on segments: 50 noisy replicates', () => {
		const holds = (e: { lower95: number | null; upper95: number | null }, v: number) =>
			(e.lower95 ?? -Infinity) <= v && v <= (e.upper95 ?? Infinity);
		let ourHeld = 0;
		let kLaHeld = 0;
		let saturationWithin3Se = 0;
		for (let seed = 1; seed <= 50; seed++) {
			const result = analyseDynamicMethod({
				dissolvedOxygenUnit: 'mgPerL',
				gasOff: { timeS: offTimeS, dissolvedOxygen: withNoise(offClean, 2 * seed) },
				gasOn: { timeS: onTimeS, dissolvedOxygen: withNoise(onClean, 2 * seed + 1) },
				gasOnStartS: 31
			});
			const our = result.ourMgPerLH!;
			expect(result.ourMmolPerLH!.value).toBeCloseTo(our.value / O2_MOLAR_MASS_G_PER_MOL, 9);
			if (holds(our, ourMgPerLH)) ourHeld++;
			if (holds(result.kLaPerH, kLaPerH)) kLaHeld++;
			const saturationError = Math.abs(result.saturation.value - saturationMgPerL);
			if (saturationError < 3 * result.saturation.standardError) saturationWithin3Se++;
		}
		expect(ourHeld).toBeGreaterThanOrEqual(45);
		expect(kLaHeld).toBeGreaterThanOrEqual(45);
		expect(saturationWithin3Se).toBeGreaterThanOrEqual(48);
	});

	it('recovers them exactly from noise-free data; percent data without C* give OUR in %/h only', () => {
		const percent = (values: number[]) => values.map((v) => (100 * v) / saturationMgPerL);
		const result = analyseDynamicMethod({
			gasOff: { timeS: offTimeS, dissolvedOxygen: percent(offClean) },
			gasOn: { timeS: onTimeS, dissolvedOxygen: percent(onClean) },
			gasOnStartS: 31
		});
		expect(result.ourPerH.value).toBeCloseTo((100 * ourMgPerLH) / saturationMgPerL, 6);
		expect(result.kLaPerH.value).toBeCloseTo(kLaPerH, 6);
		expect(result.saturation.value).toBeCloseTo(100, 6);
		expect(result.ourMgPerLH).toBeNull();
		expect(result.warnings.some((w) => w.includes('no C* in mg/L'))).toBe(true);
		const converted = analyseDynamicMethod({
			gasOff: { timeS: offTimeS, dissolvedOxygen: percent(offClean) },
			gasOn: { timeS: onTimeS, dissolvedOxygen: percent(onClean) },
			gasOnStartS: 31,
			saturationMgPerL
		});
		expect(converted.ourMgPerLH!.value).toBeCloseTo(ourMgPerLH, 6);
	});

	it('refuses a gas-off segment that does not fall, and a gas-on row that is not a reading', () => {
		const rising = errorOf(() =>
			analyseDynamicMethod({
				dissolvedOxygenUnit: 'mgPerL',
				gasOff: { timeS: offTimeS, dissolvedOxygen: [...offClean].reverse() },
				gasOn: { timeS: onTimeS, dissolvedOxygen: onClean }
			})
		);
		expect(rising.field).toBe('gasOff.dissolvedOxygen');
		expect(rising.message).toContain('Gas-off DO does not fall');
		const bad = [...onClean];
		bad[1] = Number.NaN;
		const notANumber = errorOf(() =>
			analyseDynamicMethod({
				dissolvedOxygenUnit: 'mgPerL',
				gasOff: { timeS: offTimeS, dissolvedOxygen: offClean },
				gasOn: { timeS: onTimeS, dissolvedOxygen: bad }
			})
		);
		expect(notANumber.field).toBe('gasOn.dissolvedOxygen.1');
		expect(notANumber.message).toContain('Gas-on DO, row 2');
	});
});

describe('gassing-out refusals name the field and row', () => {
	const timeS = [0, 10, 20, 30, 40, 50, 60];
	const dissolvedOxygen = [5, 30, 50, 65, 75, 82, 87];

	it('times that do not increase', () => {
		const e = errorOf(() => fitGassingOut({ timeS: [0, 10, 20, 20, 40, 50, 60], dissolvedOxygen }));
		expect(e.field).toBe('timeS.3');
		expect(e.message).toContain('Time, row 4');
	});

	it('a negative or missing reading, and one above the percent ceiling', () => {
		const negative = errorOf(() =>
			fitGassingOut({ timeS, dissolvedOxygen: [5, 30, -1, 65, 75, 82, 87] })
		);
		expect(negative.field).toBe('dissolvedOxygen.2');
		expect(negative.message).toContain('DO, row 3');
		const high = errorOf(() =>
			fitGassingOut({ timeS, dissolvedOxygen: [5, 30, 50, 65, 75, 82, 140] })
		);
		expect(high.field).toBe('dissolvedOxygen.6');
		expect(high.message).toContain('above 110 %');
		// the same number is a possible reading in mg/L only above the ceiling's reason: no refusal
		const mgPerL = fitGassingOut({
			timeS,
			dissolvedOxygen: [5, 30, 50, 65, 75, 82, 140].map((v) => v / 20),
			dissolvedOxygenUnit: 'mgPerL'
		});
		expect(mgPerL.dissolvedOxygenUnit).toBe('mgPerL');
	});

	it('too few points, mismatched lengths, a negative τp, a start that leaves too few', () => {
		const few = errorOf(() =>
			fitGassingOut({ timeS: [0, 1, 2, 3, 4], dissolvedOxygen: [1, 2, 3, 4, 5] })
		);
		expect(few.field).toBe('timeS');
		expect(few.message).toContain('at least 6 points');
		const mismatch = errorOf(() => fitGassingOut({ timeS, dissolvedOxygen: [5, 30] }));
		expect(mismatch.field).toBe('dissolvedOxygen');
		const tau = errorOf(() => fitGassingOut({ timeS, dissolvedOxygen, probeTimeConstantS: -1 }));
		expect(tau.field).toBe('probeTimeConstantS');
		expect(tau.message).toContain('Probe time constant τp');
		const late = errorOf(() => fitGassingOut({ timeS, dissolvedOxygen, startS: 35 }));
		expect(late.field).toBe('startS');
		expect(late.message).toContain('Start of the rise');
	});
});
