/** One benchmark case: `run` is timed repeatedly and its median compared with `targetMs`. */
export interface BenchCase {
	name: string;
	targetMs: number;
	run: () => unknown;
	/** How many timed repetitions; defaults to enough for a stable median. */
	repetitions?: number;
}

/** One figure a scenario measured (over HTTP, under load …) against its target, lower is better. */
export interface ScenarioFigure {
	name: string;
	value: number;
	/** absent for a figure shown for context (a size, a count), with no target of its own */
	target?: number;
	unit: string;
}

/**
 * A benchmark that is not one synchronous call: a `*.scenario.ts` file here exports
 * `scenario(): Promise<ScenarioFigure[]>`, run after the in-process cases.
 */
export type Scenario = () => Promise<ScenarioFigure[]>;
