// The hazards of a preparation as pages and PDFs show them; worked out on the server
// (server/batches/preparation-hazards.ts), shared here so the browser has the shapes.
import type { PictogramId, SignalWord } from '$chemistry';

export interface HazardStatement {
	code: string;
	text: string;
}

export interface HazardSet {
	statements: HazardStatement[];
	pictograms: PictogramId[];
	signalWord: SignalWord | null;
	/** Protective equipment the statements call for: id and plain words. */
	ppe: { id: string; text: string }[];
}

export interface PhStep {
	/** Each acid or base the instructions name, as its working solution. */
	agents: { name: string; workingSolution: string; hazards: HazardSet }[];
	/** Plain words when the instructions name none. */
	unnamed: string | null;
}

export interface PreparationHazards {
	/** Per batch line id, what is handled at that line. */
	lines: Record<string, HazardSet>;
	ph: PhStep | null;
	/** The finished solution at its concentrations; aquatic statements are for disposal. */
	finished: HazardSet;
	/** Everything the preparation calls for, across its steps. */
	ppe: { id: string; text: string }[];
	/** The lines whose handling calls for the fume hood (by name). */
	fumeHood: string[];
	/** Our own notices, not GHS: plain words, shown apart from the statements. */
	notices: { id: string; text: string }[];
}
