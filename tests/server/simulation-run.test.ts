import { describe, expect, it } from 'vitest';
import { ChemistryInputError, type SimulationResult } from '$chemistry';
import { ApiProblem } from '$lib/server/api/endpoint';
import { simulateRequest } from '$lib/server/api/operations/simulation';
import { runSimulation } from '$lib/server/simulation';

const fedBatch = {
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.6, ksGPerL: 0.05, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.1, substrateGPerL: 20, volumeL: 5 },
	feed: { strategy: 'expression', substrateGPerL: 500, expression: '0.1', startH: 4 },
	endH: 24,
	outputEveryH: 0.5
} as const;

async function failureOf(run: () => Promise<unknown>): Promise<unknown> {
	try {
		await run();
	} catch (error) {
		return error;
	}
	return null;
}

describe('the simulate endpoint’s mapping', () => {
	it('returns the series at the output times, without O2 series when no oxygen block is given', async () => {
		const answer = await runSimulation(simulateRequest.parse(fedBatch));
		expect(answer.headers.get('content-type')).toBe('application/json');
		const result: SimulationResult = await answer.json();
		expect(result.t).toHaveLength(49);
		expect(result.t[48]).toBe(24);
		expect(result.biomassGPerL).toHaveLength(49);
		expect(result.dissolvedOxygenMgPerL).toBeNull();
		expect(result.ourMmolPerLH).toBeNull();
		expect(result.events.map((e) => e.kind)).toContain('feedStarted');
	});

	it('turns an integration that cannot go on into a 422 problem that says where it stopped', async () => {
		// The feed switches on at S = 0.2 and uptake pulls S straight back: the state chatters on the switch.
		const body = simulateRequest.parse({
			mode: 'fedBatch',
			kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
			initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
			feed: { strategy: 'expression', substrateGPerL: 200, expression: 'S < 0.2 ? 0.05 : 0' },
			endH: 20,
			outputEveryH: 1
		});
		const failure = await failureOf(() => runSimulation(body));
		expect(failure).toBeInstanceOf(ApiProblem);
		expect((failure as ApiProblem).status).toBe(422);
		expect((failure as ApiProblem).message).toMatch(/did not converge at t = \d+\.\d\d h/);
	});

	it('passes the library’s field errors through (μset ≥ μmax names feed.muSetPerH)', async () => {
		// Not parsed first: the endpoint's schema already refuses it; here the library reads it itself.
		const body = {
			...fedBatch,
			feed: { strategy: 'exponential', substrateGPerL: 500, muSetPerH: 0.6 }
		} as const;
		const failure = await failureOf(() => runSimulation(body));
		expect(failure).toBeInstanceOf(ChemistryInputError);
		expect((failure as ChemistryInputError).field).toBe('feed.muSetPerH');
	});

	it('refuses an unknown key in the request rather than dropping it', () => {
		const parsed = simulateRequest.safeParse({
			...fedBatch,
			kinetics: { ...fedBatch.kinetics, muMax: 1 }
		});
		expect(parsed.success).toBe(false);
		expect(parsed.error?.issues[0].path).toEqual(['kinetics']);
	});
});
