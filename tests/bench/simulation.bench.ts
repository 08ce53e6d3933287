import type { BenchCase } from './bench';
import { simulateRun } from '../../chemistry/simulation';
import { cellCultureRun, cellCultureThreeStreams } from '../simulation-requests';

function run(): unknown {
	return simulateRun(cellCultureRun);
}

export const benches: BenchCase[] = [
	{
		name: 'simulation: 14-day fed-batch, O2 balance, DO-stat, 1-min output',
		targetMs: 50,
		run,
		repetitions: 20
	},
	{
		name: 'simulation: 14-day fed-batch as above, three feed streams',
		targetMs: 60,
		run: () => simulateRun(cellCultureThreeStreams),
		repetitions: 20
	}
];
