import { describe, expect, it } from 'vitest';
import {
	comparePlan,
	computeRunGasExchange,
	learnFromRun,
	projectRun,
	type PlannedCourse,
	type RunGasInput,
	type TimeSeries
} from '../../chemistry/run';
import { createNormalSource } from './seeded-normal';

const O2_G_PER_MOL = 31.998;

/** A constant series at the given times. */
const constant = (timeH: number[], value: number): TimeSeries => ({
	timeH,
	value: timeH.map(() => value)
});

/** 1 L/min of air at 0 °C and 101.325 kPa through 1 L of broth; exhaust 19.5 % O2, 1.3 % CO2. */
function airRun(timeH: number[], extra: Partial<RunGasInput> = {}): RunGasInput {
	return {
		gasFlowLPerMin: constant(timeH, 1),
		exhaustO2Percent: constant(timeH, 19.5),
		exhaustCo2Percent: constant(timeH, 1.3),
		volumeFallbackL: () => 1,
		referenceTemperatureC: 0,
		referencePressureKPa: 101.325,
		...extra
	};
}

// Hand calculation of the air run (ideal gas, R = 8.314462618 J/(mol·K), CODATA 2018):
//   Vm    = 8.314462618 × 273.15 / 101.325 = 22.413970 L/mol
//   F_in  = 1 L/min × 60 min/h / 22.413970 = 2.6769020 mol/h
//   y_I,in = 1 − 0.2095 − 0.0004 = 0.7901 ; y_I,out = 1 − 0.195 − 0.013 = 0.7920
//   F_out = 2.6769020 × 0.7901 / 0.7920 = 2.6704801 mol/h (inert N2 balance)
//   OUR   = (2.6769020 × 0.2095 − 2.6704801 × 0.195) / 1 L = (0.5608110 − 0.5207436)
//         = 0.0400673 mol/(L·h) = 40.0673 mmol/(L·h)
//   CER   = (2.6704801 × 0.013 − 2.6769020 × 0.0004) / 1 L = (0.0347162 − 0.0010708)
//         = 0.0336455 mol/(L·h) = 33.6455 mmol/(L·h)
//   RQ    = 33.6455 / 40.0673 = 0.83972
const HAND_OUR = 40.0673;
const HAND_CER = 33.6455;
const HAND_RQ = 0.83972;

describe('computeRunGasExchange', () => {
	it('matches the hand calculation of one logged point', () => {
		const result = computeRunGasExchange(airRun([2]))!;
		expect(result.timeH).toEqual([2]);
		expect(result.ourMmolPerLH[0]).toBeCloseTo(HAND_OUR, 3);
		expect(result.cerMmolPerLH[0]).toBeCloseTo(HAND_CER, 3);
		expect(result.respiratoryQuotient[0]).toBeCloseTo(HAND_RQ, 4);
		expect(result.skippedCount).toBe(0);
		// one point: nothing to integrate yet
		expect(result.cumulativeO2Mol).toEqual([0]);
	});

	it('reads the broth volume at each point: twice the volume halves OUR', () => {
		const result = computeRunGasExchange(airRun([1], { volumeL: constant([0, 5], 2) }))!;
		expect(result.ourMmolPerLH[0]).toBeCloseTo(HAND_OUR / 2, 3);
	});

	it('adds up O2 and CO2 by the trapezoid rule: constant OUR gives OUR·V·Δt', () => {
		const times = [0, 0.5, 1.5, 3];
		const result = computeRunGasExchange(airRun(times, { volumeFallbackL: () => 2 }))!;
		// OUR·V is the same each point (V in the denominator of OUR cancels): 40.0673 mmol/h in total.
		// Over 3 h: 40.0673 × 3 / 1000 = 0.1202019 mol O2; CER: 33.6455 × 3 / 1000 = 0.1009365 mol CO2.
		expect(result.cumulativeO2Mol[0]).toBe(0);
		expect(result.cumulativeO2Mol[3]).toBeCloseTo(0.1202019, 6);
		expect(result.cumulativeCo2Mol[3]).toBeCloseTo(0.1009365, 6);
		// and linearly in between: at 1.5 h, half of it
		expect(result.cumulativeO2Mol[2]).toBeCloseTo(0.1202019 / 2, 6);
	});

	it('skips logged times without gas flow and says why', () => {
		const times = [0, 1, 2, 3];
		const result = computeRunGasExchange(
			airRun(times, { gasFlowLPerMin: { timeH: times, value: [1, 0, 1, 1] } })
		)!;
		expect(result.timeH).toEqual([0, 2, 3]);
		expect(result.skippedCount).toBe(1);
		expect(result.skipped).toEqual([{ timeH: 1, reason: 'no gas flow' }]);
		// the totals integrate over the points kept: 3 h of constant OUR·V
		expect(result.cumulativeO2Mol[2]).toBeCloseTo((HAND_OUR * 3) / 1000, 6);
	});

	it('skips every point when no gas flow is logged at all', () => {
		const result = computeRunGasExchange(
			airRun([0, 1], { gasFlowLPerMin: { timeH: [], value: [] } })
		)!;
		expect(result.timeH).toEqual([]);
		expect(result.skippedCount).toBe(2);
		expect(result.skipped.map((s) => s.reason)).toEqual(['no gas flow', 'no gas flow']);
	});

	it('gives the in situ kLa as OUR over the driving force, C* following the inlet O2', () => {
		const airSaturationMgPerL = 7.5;
		const withAir = computeRunGasExchange(
			airRun([1, 2], {
				dissolvedOxygenPercent: { timeH: [1, 2], value: [40, 100] },
				airSaturationMgPerL
			})
		)!;
		// kLa = OUR / ((C*·yO2in/20.95 − C*·DO/100) / 31.998 mg/mmol)
		//     = 40.0673 / ((7.5 − 3.0) / 31.998) = 40.0673 / 0.1406338 = 284.906 1/h
		const expected =
			withAir.ourMmolPerLH[0] /
			((airSaturationMgPerL * (20.95 / 20.95) - (airSaturationMgPerL * 40) / 100) / O2_G_PER_MOL);
		expect(withAir.inSituKLaPerH[0]).toBeCloseTo(expected, 6);
		expect(withAir.inSituKLaPerH[0]).toBeCloseTo(284.906, 2);
		// at saturation there is no driving force: no kLa
		expect(withAir.inSituKLaPerH[1]).toBeNull();

		// O2-enriched inlet (40 % O2): C* = 7.5 × 40 / 20.95 = 14.320 mg/L, so 100 % of air saturation
		// (7.5 mg/L) leaves a driving force.
		const enriched = computeRunGasExchange(
			airRun([1], {
				inletO2Percent: constant([1], 40),
				exhaustO2Percent: constant([1], 38),
				exhaustCo2Percent: constant([1], 1.5),
				dissolvedOxygenPercent: constant([1], 100),
				airSaturationMgPerL
			})
		)!;
		const enrichedExpected =
			enriched.ourMmolPerLH[0] /
			((airSaturationMgPerL * (40 / 20.95) - airSaturationMgPerL) / O2_G_PER_MOL);
		expect(enriched.inSituKLaPerH[0]).toBeCloseTo(enrichedExpected, 6);
	});

	it('leaves the kLa out when DO or C* is not known', () => {
		const result = computeRunGasExchange(airRun([1], { airSaturationMgPerL: 7.5 }))!;
		expect(result.inSituKLaPerH).toEqual([null]);
	});
});

/** A plan growing X = 0.5·e^(0.3 t) to 12 h, substrate above 0.1 g/L until 10 h. */
function exponentialPlan(overrides: Partial<PlannedCourse> = {}): PlannedCourse {
	const timeH = Array.from({ length: 25 }, (_, i) => i * 0.5);
	return {
		timeH,
		biomassGPerL: timeH.map((t) => 0.5 * Math.exp(0.3 * t)),
		substrateGPerL: timeH.map((t) => Math.max(0, 20 - 2 * t)),
		dissolvedOxygenPercent: timeH.map((t) => (t < 8 ? 60 : 30)),
		ourMmolPerLH: timeH.map((t) => 5 * Math.exp(0.3 * t)),
		volumeL: timeH.map(() => 1),
		maxOtrMmolPerLH: null,
		oxygenLimitedFromH: 8,
		targetBiomassGPerL: 30,
		...overrides
	};
}

const planned = (t: number) => 0.5 * Math.exp(0.3 * t);
const kinds = (flags: { kind: string }[]) => flags.map((f) => f.kind);

describe('comparePlan', () => {
	const sampleH = [1, 2, 3, 4];

	it('flags growth 30 % ahead of the plan', () => {
		const result = comparePlan(exponentialPlan(), {
			biomassGPerL: { timeH: sampleH, value: sampleH.map((t) => 1.3 * planned(t)) }
		});
		expect(kinds(result.flags)).toEqual(['growthAhead']);
		expect(result.flags[0].atH).toBe(4);
		expect(result.latestGrowthRatio).toBeCloseTo(1.3, 10);
		expect(result.flags[0].message).toContain('30 % above');
	});

	it('flags growth 30 % behind the plan', () => {
		const result = comparePlan(exponentialPlan(), {
			biomassGPerL: { timeH: sampleH, value: sampleH.map((t) => 0.7 * planned(t)) }
		});
		expect(kinds(result.flags)).toEqual(['growthBehind']);
		expect(result.latestGrowthRatio).toBeCloseTo(0.7, 10);
	});

	it('does not flag growth within 10 % of the plan', () => {
		for (const factor of [0.9, 1.1]) {
			const result = comparePlan(exponentialPlan(), {
				biomassGPerL: { timeH: sampleH, value: sampleH.map((t) => factor * planned(t)) }
			});
			expect(kinds(result.flags)).toEqual([]);
		}
	});

	it('flags DO below the limit from 3 h, held for more than 0.25 h, when the plan limits at 8 h', () => {
		const timeH = Array.from({ length: 81 }, (_, i) => i * 0.05);
		const result = comparePlan(exponentialPlan(), {
			dissolvedOxygenPercent: { timeH, value: timeH.map((t) => (t < 3 - 1e-9 ? 60 : 20)) }
		});
		expect(kinds(result.flags)).toEqual(['oxygenEarly']);
		expect(result.flags[0].atH).toBeCloseTo(3, 10);
	});

	it('does not flag a single DO reading below the limit', () => {
		const timeH = Array.from({ length: 81 }, (_, i) => i * 0.05);
		const result = comparePlan(exponentialPlan(), {
			dissolvedOxygenPercent: { timeH, value: timeH.map((_, i) => (i === 60 ? 20 : 60)) }
		});
		expect(kinds(result.flags)).toEqual([]);
	});

	it('flags the carbon source run out at 4 h when the plan keeps it until 10 h', () => {
		// plan: S = 20 − 2t, first below 0.1 g/L at the 10 h point
		const result = comparePlan(exponentialPlan(), {
			substrateGPerL: { timeH: [1, 3, 4], value: [15, 5, 0.05] }
		});
		expect(kinds(result.flags)).toEqual(['substrateEarly']);
		expect(result.flags[0].atH).toBe(4);
		expect(result.flags[0].message).toContain('10 h');
	});

	it('does not flag the carbon source running out when the plan runs out at the same time', () => {
		const result = comparePlan(exponentialPlan(), {
			substrateGPerL: { timeH: [9, 10], value: [2, 0.05] }
		});
		expect(kinds(result.flags)).toEqual([]);
	});
});

describe('projectRun', () => {
	it('projects from an exponential run at μ 0.25 1/h to the target and the oxygen limit', () => {
		const mu = 0.25;
		const timeH = [0, 1, 2, 3, 4, 5, 6];
		const x = timeH.map((t) => 0.4 * Math.exp(mu * t));
		const our = timeH.map((t) => 4 * Math.exp(mu * t));
		const plan = exponentialPlan({ maxOtrMmolPerLH: 100, targetBiomassGPerL: 30 });
		const projection = projectRun(plan, {
			biomassGPerL: { timeH, value: x },
			ourMmolPerLH: { timeH, value: our }
		})!;
		expect(projection.muPerH).toBeCloseTo(mu, 10);
		expect(projection.fromH).toBe(6);
		// independent: X(6) = 0.4·e^1.5 = 1.79268 g/L; ln(30/1.79268) = 2.81749; /0.25 = 11.2700 h after 6 h
		const xLast = 0.4 * Math.exp(1.5);
		expect(projection.targetAtH).toBeCloseTo(6 + Math.log(30 / xLast) / mu, 8);
		expect(projection.targetAtH).toBeCloseTo(17.27, 3);
		// OUR(6) = 4·e^1.5 = 17.9268 mmol/(L·h); ln(100/17.9268)/0.25 = 6.8755 h after 6 h
		const ourLast = 4 * Math.exp(1.5);
		expect(projection.oxygenLimitAtH).toBeCloseTo(6 + Math.log(100 / ourLast) / mu, 8);
		expect(projection.oxygenLimitAtH).toBeCloseTo(12.8755, 3);
	});

	it('projects no oxygen limit without the vessel’s maximum OTR, and none without growth', () => {
		const timeH = [0, 1, 2, 3];
		const noOtr = projectRun(exponentialPlan(), {
			biomassGPerL: { timeH, value: timeH.map((t) => Math.exp(0.2 * t)) },
			ourMmolPerLH: { timeH, value: [1, 2, 3, 4] }
		})!;
		expect(noOtr.oxygenLimitAtH).toBeNull();
		const flat = projectRun(exponentialPlan({ maxOtrMmolPerLH: 100 }), {
			biomassGPerL: constant(timeH, 2)
		})!;
		expect(flat.muPerH).toBeCloseTo(0, 10);
		expect(flat.targetAtH).toBeNull();
	});

	// μ comes from the dry-weight samples (to 4 h) and OUR from its latest reading (6 h): the OUR of
	// 6 h must be projected from 6 h, or the limit would come 2 h early.
	it('projects the oxygen limit from the time of the OUR it starts from', () => {
		const mu = 0.25;
		const sampleH = [0, 1, 2, 3, 4];
		const ourH = Array.from({ length: 61 }, (_, i) => i * 0.1);
		const projection = projectRun(exponentialPlan({ maxOtrMmolPerLH: 100 }), {
			biomassGPerL: { timeH: sampleH, value: sampleH.map((t) => 0.4 * Math.exp(mu * t)) },
			ourMmolPerLH: { timeH: ourH, value: ourH.map((t) => 4 * Math.exp(mu * t)) }
		})!;
		// OUR = 4·e^(0.25 t) reaches 100 at t = ln(25)/0.25 = 12.8755 h
		expect(projection.oxygenLimitAtH).toBeCloseTo(Math.log(100 / 4) / mu, 3);
	});

	it('projects nothing from fewer than three biomass samples and no OUR', () => {
		expect(
			projectRun(exponentialPlan(), { biomassGPerL: { timeH: [0, 1], value: [1, 2] } })
		).toBeNull();
	});
});

/** Batch growth X = X0·e^(μt), S = S0 − (X − X0)/Y: no feed, constant volume. */
function exponentialBatch(timeH: number[], mu: number, x0: number, s0: number, yieldXS: number) {
	const x = timeH.map((t) => x0 * Math.exp(mu * t));
	return {
		biomassGPerL: { timeH, value: x },
		substrateGPerL: { timeH, value: x.map((xi) => s0 - (xi - x0) / yieldXS) }
	};
}

describe('learnFromRun', () => {
	const timeH = [0, 1, 2, 3, 4, 5, 6, 7, 8];
	const volumeL = 2;

	it('reads Yx/s back from a batch grown with it', () => {
		const batch = exponentialBatch(timeH, 0.3, 0.2, 20, 0.48);
		const learned = learnFromRun({ ...batch, volumeAtL: () => volumeL });
		expect(learned.yieldXSGPerG.value).toBeCloseTo(0.48, 10);
		expect(learned.yieldXSGPerG.basis).toContain('carbon source used');
	});

	it('reads Yx/O2 back from an O2 series consistent with 1.2 g/g', () => {
		const batch = exponentialBatch(timeH, 0.3, 0.2, 20, 0.48);
		// O2 consumed to t: (X(t) − X0)·V / (Yx/O2 · 31.998 g/mol), on a finer grid than the samples
		const o2TimeH = Array.from({ length: 33 }, (_, i) => i * 0.25);
		const o2Mol = o2TimeH.map(
			(t) => ((0.2 * Math.exp(0.3 * t) - 0.2) * volumeL) / (1.2 * O2_G_PER_MOL)
		);
		const learned = learnFromRun({
			...batch,
			volumeAtL: () => volumeL,
			cumulativeO2Mol: { timeH: o2TimeH, value: o2Mol }
		});
		expect(learned.yieldXO2GPerG.value).toBeCloseTo(1.2, 10);
	});

	it('leaves Yx/O2 out when the gas data do not cover the samples', () => {
		const batch = exponentialBatch(timeH, 0.3, 0.2, 20, 0.48);
		const learned = learnFromRun({
			...batch,
			volumeAtL: () => volumeL,
			cumulativeO2Mol: { timeH: [1, 8], value: [0, 0.1] }
		});
		expect(learned.yieldXO2GPerG.value).toBeNull();
		expect(learned.yieldXO2GPerG.basis).toMatch(/do not cover/);
	});

	it('gives no Yx/s for a fed run whose feed concentration is unknown, and says why', () => {
		const batch = exponentialBatch(timeH, 0.3, 0.2, 20, 0.48);
		const learned = learnFromRun({
			...batch,
			volumeAtL: (t) => 2 + 0.05 * t,
			feedAddedL: { timeH, value: timeH.map((t) => 0.05 * t) },
			feedSubstrateGPerL: null
		});
		expect(learned.yieldXSGPerG.value).toBeNull();
		expect(learned.yieldXSGPerG.basis).toMatch(/fed.*concentration is unknown/);
	});

	it('counts the fed carbon source when its concentration is given', () => {
		// Fed at 0.05 L/h of 400 g/L into 2 L: by 8 h 0.4 L and 160 g of substrate added.
		// Made = X(8)·2.4 − X(0)·2; used = S(0)·2 + 160 − S(8)·2.4; with S chosen so used = made/0.5.
		const x0 = 0.2;
		const x8 = 0.2 * Math.exp(0.3 * 8);
		const madeG = x8 * 2.4 - x0 * 2;
		const s0 = 20;
		const s8 = (s0 * 2 + 160 - madeG / 0.5) / 2.4;
		const learned = learnFromRun({
			biomassGPerL: { timeH: [0, 8], value: [x0, x8] },
			substrateGPerL: { timeH: [0, 8], value: [s0, s8] },
			volumeAtL: (t) => 2 + 0.05 * t,
			feedAddedL: { timeH: [0, 8], value: [0, 0.4] },
			feedSubstrateGPerL: 400
		});
		expect(learned.yieldXSGPerG.value).toBeCloseTo(0.5, 10);
	});

	it('recovers μmax within its 95 % interval from 12 samples with 1 % noise', () => {
		const mu = 0.3;
		const normal = createNormalSource(20261203);
		const sampleH = Array.from({ length: 12 }, (_, i) => i * 0.5);
		const x = sampleH.map((t) => 0.2 * Math.exp(mu * t) * Math.exp(0.01 * normal()));
		const learned = learnFromRun({
			biomassGPerL: { timeH: sampleH, value: x },
			volumeAtL: () => 1
		});
		const estimate = learned.muMaxPerH.value!;
		expect(estimate).not.toBeNull();
		expect(estimate.lower95!).toBeLessThanOrEqual(mu);
		expect(estimate.upper95!).toBeGreaterThanOrEqual(mu);
		expect(estimate.value).toBeCloseTo(mu, 1);
		expect(learned.muMaxPerH.basis).toMatch(/exponential phase/);
		// no substrate samples: no Yx/s, with the reason
		expect(learned.yieldXSGPerG.value).toBeNull();
		expect(learned.yieldXSGPerG.basis).toMatch(/substrate samples/);
	});
});
