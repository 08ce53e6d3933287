import type { BenchCase } from './bench';
import { simulateRun, type SimulationRequest } from '../../chemistry/simulation';

// A cell-culture-like 14-day fed-batch: DO-stat feeding on a vessel with modest oxygen transfer.
export const cellCultureRun: SimulationRequest = {
	mode: 'fedBatch',
	kinetics: {
		muMaxPerH: 0.04,
		ksGPerL: 0.2,
		yieldXS: 0.5,
		maintenanceGPerGH: 0.002,
		yieldXO2: 1.5,
		koMgPerL: 0.1,
		alpha: 0.05,
		beta: 0.001
	},
	initial: { biomassGPerL: 0.3, substrateGPerL: 4, volumeL: 1 },
	feed: {
		strategy: 'doStat',
		substrateGPerL: 100,
		doSetpointMgPerL: 2,
		maxRateLPerH: 0.004,
		startH: 48
	},
	oxygen: { kLaPerH: 15, saturationMgPerL: 6.7, maintenanceMgPerGH: 2 },
	maxVolumeL: 3,
	endH: 14 * 24,
	outputEveryH: 1 / 60
};

// The same culture fed by three streams: DO-stat glucose, a constant amino-acid feed carrying no
// modelled substrate, and a capped exponential glucose top-up from day 4.
const { feed: glucose, ...withoutFeed } = cellCultureRun;
const threeStreams: SimulationRequest = {
	...withoutFeed,
	feeds: [
		{ ...glucose!, label: 'Glucose (DO-stat)' },
		{
			label: 'Amino acids',
			strategy: 'constant',
			substrateGPerL: 0,
			rateLPerH: 0.0005,
			startH: 72
		},
		{
			label: 'Glucose top-up',
			strategy: 'exponential',
			substrateGPerL: 100,
			muSetPerH: 0.005,
			maxRateLPerH: 0.002,
			startH: 96
		}
	]
};

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
		run: () => simulateRun(threeStreams),
		repetitions: 20
	}
];
