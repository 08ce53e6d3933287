/** One benchmark case: `run` is timed repeatedly and its median compared with `targetMs`. */
export interface BenchCase {
	name: string;
	targetMs: number;
	run: () => unknown;
	/** How many timed repetitions; defaults to enough for a stable median. */
	repetitions?: number;
}
