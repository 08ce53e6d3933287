import type { SimulationRequest, OperatingMode } from '$chemistry';

/** A saved scenario as the page receives it (dates as ISO strings). */
export interface ScenarioSummary {
	id: string;
	name: string;
	mode: OperatingMode;
	notes: string | null;
	request: SimulationRequest;
	createdAt: string;
	updatedAt: string;
}
