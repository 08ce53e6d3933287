import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BenchCase } from './bench';
import { simulateRun, type SimulationRequest } from '../../chemistry/simulation';

// The stiff runs: 14-day microbial fed-batches (μmax 0.5 /h, Ks 0.1 g/L) whose substrate, and DO with an
// O2 balance, settle far faster than the culture changes. The requests are those of the SciPy reference
// cases (tests/chemistry/reference/simulation-reference.json); tests/chemistry/reference/fedbatch_lsoda.py
// times SciPy's LSODA in-process on the same model and requests.
const reference: { cases: { name: string; request: SimulationRequest }[] } = JSON.parse(
	readFileSync(
		join(import.meta.dirname, '..', 'chemistry', 'reference', 'simulation-reference.json'),
		'utf8'
	)
);

function requestOf(name: string): SimulationRequest {
	const found = reference.cases.find((c) => c.name === name);
	if (found === undefined) throw new Error(`no reference case named “${name}”`);
	return found.request;
}

const constantFeed = requestOf('constant-feed fed-batch to the Pirt ceiling, 14 days');
const withOxygen = requestOf(
	'exponential then capped feed with an O2 balance and O2-limited growth, 14 days'
);

// Targets: SciPy's LSODA on the same runs took ~25 and ~29 ms in-process here (fedbatch_lsoda.py).
export const benches: BenchCase[] = [
	{
		name: 'simulation: 14-day microbial fed-batch, constant feed',
		targetMs: 25,
		run: () => simulateRun(constantFeed),
		repetitions: 20
	},
	{
		name: 'simulation: 14-day microbial fed-batch, O2 balance',
		targetMs: 29,
		run: () => simulateRun(withOxygen),
		repetitions: 20
	}
];
