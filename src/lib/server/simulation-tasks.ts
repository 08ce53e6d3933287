// The science the worker pool runs, as one table read by both sides: the worker
// (simulation-worker.ts) calls a task's function; the pool (simulation-pool.ts) types its calls from
// it. A thread passes only data, so the science's own errors cross as a `TaskFailure` and are made
// again on the other side, class, field and all. Imports nothing but `$chemistry`: it is bundled
// into the worker.
import {
	ChemistryInputError,
	SimulationFailedError,
	StudyDataError,
	compareBatchWithContinuous,
	computeChemostatSteadyState,
	evaluateStudy,
	fitGrowthCurve,
	simulateRun,
	type SimulationFailureReason,
	type SimulationRequest,
	type StudyInputs,
	type WhatIf
} from '$chemistry';

export const SCIENCE_TASKS = {
	// The answer of POST /api/v1/simulate as JSON text, written here: a string crosses to the request
	// thread as one copy, where the result's objects would be cloned and then stringified there.
	simulate: (request: SimulationRequest) => {
		const { tolerances, integratorSteps, quasiSteadyOxygenH, ...series } = simulateRun(request);
		return JSON.stringify({ ...series, quasiSteadyOxygenH, tolerances, integratorSteps });
	},
	chemostat: computeChemostatSteadyState,
	batchVersusContinuous: compareBatchWithContinuous,
	growthFit: fitGrowthCurve,
	study: ({ inputs, whatIf }: { inputs: StudyInputs; whatIf: WhatIf }) =>
		evaluateStudy(inputs, whatIf)
};

type Tasks = typeof SCIENCE_TASKS;
export type ScienceTaskKind = keyof Tasks;
export type ScienceInput<K extends ScienceTaskKind> = Parameters<Tasks[K]>[0];
export type ScienceOutput<K extends ScienceTaskKind> = ReturnType<Tasks[K]>;
export interface ScienceTask<K extends ScienceTaskKind = ScienceTaskKind> {
	kind: K;
	input: ScienceInput<K>;
}

/** What a task is called in a refusal, and what to change when it runs past the time limit. */
export const TASK_WORDING: Record<ScienceTaskKind, { name: string; advice: string }> = {
	simulate: {
		name: 'The simulation',
		advice:
			'try a shorter end time (endH), fewer or smoother feed streams, or a coarser output interval (outputEveryH)'
	},
	chemostat: { name: 'The steady-state calculation', advice: 'try fewer sweep points' },
	batchVersusContinuous: {
		name: 'The batch-against-continuous comparison',
		advice: 'check the kinetic parameters and the conversion'
	},
	growthFit: { name: 'The growth fit', advice: 'try fewer data points or fewer curve points' },
	study: {
		name: 'The study evaluation',
		advice: 'try fewer or smoother feed plans, or a lower target'
	}
};

export type TaskFailure =
	| { type: 'input'; message: string; field?: string; position?: number; studyData: boolean }
	| { type: 'simulation'; message: string; reason: SimulationFailureReason; tH: number };

export type TaskAnswer<T> = { ok: true; value: T } | { ok: false; failure: TaskFailure };

/** Runs a task in the worker; the science's own refusals come back as data, anything else throws. */
export function answerTask<K extends ScienceTaskKind>(
	task: ScienceTask<K>
): TaskAnswer<ScienceOutput<K>> {
	const run = SCIENCE_TASKS[task.kind] as (input: ScienceInput<K>) => ScienceOutput<K>;
	try {
		return { ok: true, value: run(task.input) };
	} catch (cause) {
		if (cause instanceof SimulationFailedError) {
			const { message, reason, tH } = cause;
			return { ok: false, failure: { type: 'simulation', message, reason, tH } };
		}
		if (cause instanceof ChemistryInputError) {
			const { message, field, position } = cause;
			const studyData = cause instanceof StudyDataError;
			return { ok: false, failure: { type: 'input', message, field, position, studyData } };
		}
		throw cause;
	}
}

/** The error the science threw in the worker, made again in this thread. */
export function errorOf(failure: TaskFailure): Error {
	if (failure.type === 'simulation')
		return new SimulationFailedError(failure.message, failure.reason, failure.tH);
	const { message, field, position } = failure;
	return failure.studyData
		? new StudyDataError(message, { field })
		: new ChemistryInputError(message, { field, position });
}
