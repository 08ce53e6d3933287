// The wall-clock limit of one run in the worker pool (simulation-pool.ts): a simulation, fit or
// study evaluation still running after it is stopped, so that no request can hold a thread for
// long. A site setting; 10 s is well beyond any ordinary run here (the benchmarks' 14-day fed-batch
// takes tens of milliseconds) and short enough that a person is still waiting for the answer.
import { readDecimalText } from '$lib/number-reading';
import type { Actor } from './audit';
import { db, type Db } from './db';
import { RuleError } from './rule-error';
import { settingText, storeSetting } from './site-settings';

type Reader = Pick<Db, 'select'>;

export const SIMULATION_TIME_LIMIT_KEY = 'simulation.time_limit_s';
export const DEFAULT_SIMULATION_TIME_LIMIT_S = 10;
export const SIMULATION_TIME_LIMIT_RANGE_S = { min: 0.1, max: 600 } as const;
export const SIMULATION_TIME_LIMIT_LABEL = 'Time limit per run (s)';

/** The stored limit, or the default when unset or unreadable. */
function limitOf(stored: string | undefined): number {
	const value = stored === undefined ? NaN : Number(stored);
	return Number.isFinite(value) && value > 0 ? value : DEFAULT_SIMULATION_TIME_LIMIT_S;
}

export function simulationTimeLimitS(reader: Reader = db): number {
	return limitOf(settingText(SIMULATION_TIME_LIMIT_KEY, reader));
}

export function setSimulationTimeLimitS(actor: Actor, text: string): void {
	const { min, max } = SIMULATION_TIME_LIMIT_RANGE_S;
	const read = readDecimalText(text, SIMULATION_TIME_LIMIT_LABEL);
	if (!read.ok) throw new RuleError(read.message, { field: 'simulationTimeLimitS' });
	if (read.value < min || read.value > max)
		throw new RuleError(
			`${SIMULATION_TIME_LIMIT_LABEL} must be from ${min} to ${max} seconds (got ${read.value}).`,
			{ field: 'simulationTimeLimitS' }
		);
	storeSetting(
		actor,
		{
			key: SIMULATION_TIME_LIMIT_KEY,
			value: String(read.value),
			action: 'settings.simulation_time_limit_s'
		},
		limitOf
	);
}
