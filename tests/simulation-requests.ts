// Simulation requests shared by the benchmarks and the server tests: one description of each run,
// so a benchmark figure and a test speak of the same culture.
import type { SimulationRequest } from '../chemistry/simulation';

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
export const cellCultureThreeStreams: SimulationRequest = {
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

// Eight feed streams whose rates swing at different frequencies: the integrator follows every swing
// (thousands of steps, about 1 s per 100 h here) while the answer stays small (one point an hour).
export const swingingStreams = (endH: number): SimulationRequest => ({
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
	feeds: Array.from({ length: 8 }, (_, i) => ({
		label: `Stream ${i + 1}`,
		strategy: 'expression' as const,
		substrateGPerL: 200,
		expression: `0.0001 * (1 + sin(${10 * (i + 1)} * t))`
	})),
	maxVolumeL: 1000,
	endH,
	outputEveryH: 1
});
