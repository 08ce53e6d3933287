import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ChemistryInputError } from '../../chemistry/errors';
import {
	compileFeedExpression,
	SIMULATION_MODEL_HELP,
	SimulationFailedError,
	simulateRun,
	type SimulationRequest
} from '../../chemistry/simulation';
import { errorOf } from './input-error';

const base: SimulationRequest = {
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
	feed: { strategy: 'constant', substrateGPerL: 200, rateLPerH: 0.01 },
	endH: 10,
	outputEveryH: 1
};

function fieldOf(overrides: Partial<SimulationRequest>): string | undefined {
	return errorOf(() => simulateRun({ ...base, ...overrides })).field;
}

describe('request validation names the field', () => {
	it.each([
		['kinetics.muMaxPerH', { kinetics: { ...base.kinetics, muMaxPerH: 0 } }],
		['kinetics.ksGPerL', { kinetics: { ...base.kinetics, ksGPerL: -1 } }],
		['kinetics.yieldXS', { kinetics: { ...base.kinetics, yieldXS: Number.NaN } }],
		['kinetics.maintenanceGPerGH', { kinetics: { ...base.kinetics, maintenanceGPerGH: -0.1 } }],
		['initial.biomassGPerL', { initial: { ...base.initial, biomassGPerL: 0 } }],
		['initial.volumeL', { initial: { ...base.initial, volumeL: -2 } }],
		['endH', { endH: 1441 }],
		['endH', { endH: 0 }],
		['outputEveryH', { endH: 1440, outputEveryH: 0.01 }],
		['outputEveryH', { outputEveryH: 0 }],
		['feed', { feed: undefined }],
		['feed.rateLPerH', { feed: { strategy: 'constant', substrateGPerL: 200 } }],
		['feed.startH', { feed: { ...base.feed!, startH: 10 } }],
		['feed.strategy', { feed: { ...base.feed!, strategy: 'pulsed' as 'constant' } }],
		['mode', { mode: 'repeatedBatch' as 'batch' }],
		['maxVolumeL', { maxVolumeL: 0 }],
		['initial.volumeL', { maxVolumeL: 1 }],
		['feed.bolusL', { maxVolumeL: 1.2, feed: { ...base.feed!, bolusL: 0.5 } }]
	] as const)('%s', (field, overrides) => {
		expect(fieldOf(overrides as Partial<SimulationRequest>)).toBe(field);
	});

	it('refuses μset at or above μmax', () => {
		const e = errorOf(() =>
			simulateRun({
				...base,
				feed: { strategy: 'exponential', substrateGPerL: 200, muSetPerH: 0.5 }
			})
		);
		expect(e.field).toBe('feed.muSetPerH');
		expect(e.message).toMatch(/^Feed μset \(0\.5 \/h\) must be below μmax \(0\.5 \/h\)/);
	});

	it('refuses an exponential feed no richer than the broth', () => {
		expect(fieldOf({ feed: { strategy: 'exponential', substrateGPerL: 1, muSetPerH: 0.2 } })).toBe(
			'feed.substrateGPerL'
		);
	});

	it('refuses a field the chosen strategy would ignore', () => {
		const e = errorOf(() =>
			simulateRun({
				...base,
				feed: { strategy: 'exponential', substrateGPerL: 200, muSetPerH: 0.2, rateLPerH: 0.1 }
			})
		);
		expect(e.field).toBe('feed.rateLPerH');
		expect(e.message).toMatch(/not used by the exponential strategy/);
	});

	it('refuses a substrate setpoint at or above the feed concentration', () => {
		expect(
			fieldOf({ feed: { strategy: 'substrateStat', substrateGPerL: 2, setpointGPerL: 2 } })
		).toBe('feed.setpointGPerL');
	});

	it('needs the oxygen block for a DO-stat feed, and Yx/O2 for an oxygen balance', () => {
		expect(
			fieldOf({
				feed: { strategy: 'doStat', substrateGPerL: 200, doSetpointMgPerL: 2, maxRateLPerH: 0.1 }
			})
		).toBe('oxygen');
		expect(fieldOf({ oxygen: { kLaPerH: 100, saturationMgPerL: 7 } })).toBe('kinetics.yieldXO2');
		expect(fieldOf({ kinetics: { ...base.kinetics, koMgPerL: 0.1 } })).toBe('kinetics.koMgPerL');
		expect(
			fieldOf({
				kinetics: { ...base.kinetics, yieldXO2: 1 },
				oxygen: { kLaPerH: 100, saturationMgPerL: 7 },
				feed: { strategy: 'doStat', substrateGPerL: 200, doSetpointMgPerL: 8, maxRateLPerH: 0.1 }
			})
		).toBe('feed.doSetpointMgPerL');
	});

	it('refuses mode and setting combinations that make no sense', () => {
		expect(fieldOf({ mode: 'batch' })).toBe('feed');
		expect(fieldOf({ mode: 'chemostat', feed: { strategy: 'constant', substrateGPerL: 10 } })).toBe(
			'dilutionPerH'
		);
		expect(fieldOf({ dilutionPerH: 0.1 })).toBe('dilutionPerH');
		expect(fieldOf({ mode: 'chemostat', dilutionPerH: 0.1 })).toBe('feed.rateLPerH');
		expect(
			fieldOf({
				mode: 'chemostat',
				dilutionPerH: 0.1,
				feed: { strategy: 'exponential', substrateGPerL: 10 }
			})
		).toBe('feed.strategy');
		expect(
			fieldOf({
				mode: 'perfusion',
				dilutionPerH: 0.5,
				feed: { strategy: 'constant', substrateGPerL: 10 },
				perfusion: { retentionEfficiency: 0.9, bleedPerH: 0.6 }
			})
		).toBe('perfusion.bleedPerH');
		expect(
			fieldOf({
				mode: 'perfusion',
				dilutionPerH: 0.5,
				feed: { strategy: 'constant', substrateGPerL: 10 },
				perfusion: { retentionEfficiency: 1.2, bleedPerH: 0.1 }
			})
		).toBe('perfusion.retentionEfficiency');
		expect(fieldOf({ mode: 'drawFill', feed: { strategy: 'constant', substrateGPerL: 10 } })).toBe(
			'drawFill'
		);
		expect(
			fieldOf({
				mode: 'drawFill',
				feed: { strategy: 'constant', substrateGPerL: 10 },
				drawFill: { fraction: 1, everyH: 5 }
			})
		).toBe('drawFill.fraction');
		expect(fieldOf({ perfusion: { retentionEfficiency: 1, bleedPerH: 0.1 } })).toBe('perfusion');
	});
});

describe('feed expression sandbox', () => {
	it.each([
		['import("fs")', /function "import" is not allowed/],
		['x = 2', /may not assign/],
		['f(x) = x', /may not define functions/],
		['foo', /Unknown name "foo"/],
		['2 kg', /Unknown name "kg"/],
		['X[1]', /index access/],
		['t.constructor', /property or index access/],
		['evaluate("1")', /function "evaluate" is not allowed/],
		['"text"', /Only numbers/],
		['[1, 2]', /arrays/],
		['{a: 1}', /objects/],
		['1:3', /ranges/],
		['t; X', /single expression/],
		['cos(t) to deg', /operator "to"/]
	])('refuses %s', (source, message) => {
		const e = errorOf(() => compileFeedExpression(source));
		expect(e.field).toBe('feed.expression');
		expect(e.message).toMatch(message);
	});

	it('points at a syntax error', () => {
		const e = errorOf(() => compileFeedExpression('0.1 * ) + t'));
		expect(e.field).toBe('feed.expression');
		expect(e.position).toBe('0.1 * '.length);
		expect(errorOf(() => compileFeedExpression('0.1 * (t + ')).position).toBe('0.1 * (t + '.length);
	});

	it('evaluates allowed arithmetic on t and the states', () => {
		const f = compileFeedExpression(
			'max(0, 0.01 * exp(0.1 * t)) * V + (DO < 2 ? 0 : 0.001 * X) + S * P * C * 0 + pi - e'
		);
		const value = f.evaluate({ t: 10, X: 5, S: 1, P: 0, V: 2, DO: 3, C: 3 });
		expect(value).toBeCloseTo(0.01 * Math.exp(1) * 2 + 0.005 + Math.PI - Math.E, 12);
	});

	it('throws only ChemistryInputError, whatever text it is given', () => {
		let refused = 0;
		fc.assert(
			fc.property(fc.string({ maxLength: 40 }), (source) => {
				let compiled: ReturnType<typeof compileFeedExpression> | undefined;
				try {
					compiled = compileFeedExpression(source);
				} catch (e) {
					refused++;
					expect(e).toBeInstanceOf(ChemistryInputError);
					expect((e as ChemistryInputError).field).toBe('feed.expression');
					return;
				}
				expect(typeof compiled.evaluate).toBe('function');
			}),
			{ numRuns: 300 }
		);
		// Random text is almost never a valid expression: the refusal path must have been exercised.
		expect(refused).toBeGreaterThan(0);
	});

	it('stops the run when the expression gives a negative rate, naming the time', () => {
		const e = errorOf(() =>
			simulateRun({
				...base,
				feed: { strategy: 'expression', substrateGPerL: 200, expression: '0.01 - 0.002 * t' }
			})
		);
		expect(e.field).toBe('feed.expression');
		expect(e.message).toMatch(/at t = 5\.\d+ h/);
	});

	it('refuses a rate of more than 1000 culture volumes per hour as a unit slip (a plausibility guard of this product, not a published limit)', () => {
		const e = errorOf(() =>
			simulateRun({
				...base,
				feed: { strategy: 'expression', substrateGPerL: 200, expression: '1e200' }
			})
		);
		expect(e.field).toBe('feed.expression');
		expect(e.message).toMatch(/more than 1000 times the culture volume/);
		expect(fieldOf({ feed: { strategy: 'constant', substrateGPerL: 200, rateLPerH: 1001 } })).toBe(
			'feed.rateLPerH'
		);
		// Capped by the pump's top rate, the same expression is a plan.
		expect(() =>
			simulateRun({
				...base,
				feed: {
					strategy: 'expression',
					substrateGPerL: 200,
					expression: '1e200',
					maxRateLPerH: 0.01
				}
			})
		).not.toThrow();
		// 1000 volumes per hour exactly is still accepted.
		expect(() =>
			simulateRun({
				...base,
				endH: 0.001,
				outputEveryH: 0.001,
				feed: { strategy: 'constant', substrateGPerL: 200, rateLPerH: 1000 }
			})
		).not.toThrow();
	});

	it('refuses unknown names through simulateRun as well', () => {
		expect(
			fieldOf({ feed: { strategy: 'expression', substrateGPerL: 200, expression: 'foo * t' } })
		).toBe('feed.expression');
	});
});

describe('integration failure', () => {
	it('reports an on/off feed it cannot integrate instead of returning numbers', () => {
		// The feed switches at S = 0.2 and consumption pulls S straight back: the state chatters on the
		// switch and the step size collapses.
		let error: unknown;
		try {
			simulateRun({
				...base,
				feed: { strategy: 'expression', substrateGPerL: 200, expression: 'S < 0.2 ? 0.05 : 0' },
				endH: 20
			});
		} catch (e) {
			error = e;
		}
		expect(error).toBeInstanceOf(SimulationFailedError);
		expect((error as SimulationFailedError).reason).toBe('stepLimit');
		expect((error as SimulationFailedError).tH).toBeLessThan(20);
	});
});

describe('model help', () => {
	it('describes every event kind and the tolerances', () => {
		for (const kind of [
			'substrateExhausted',
			'oxygenLimited',
			'oxygenDepleted',
			'maxVolumeReached',
			'washout'
		]) {
			expect(SIMULATION_MODEL_HELP).toContain(kind);
		}
		expect(SIMULATION_MODEL_HELP).toContain('1e-8');
	});
});
