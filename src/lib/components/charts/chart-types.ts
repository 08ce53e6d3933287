// Chart shapes and styles without Chart.js itself, so pure modules can build chart data.
export interface ChartMarker {
	x: number;
	label: string;
}

/** Series colours: ink-green, grain, slate blue, brick; a second scenario reuses them dashed. */
export const SERIES_COLOURS = ['#1d4c45', '#c8791c', '#3b5b8c', '#9c3d2e', '#5a7d2a', '#6b4c8a'];
export const SCENARIO_DASHES: number[][] = [[], [7, 4], [2, 3]];

export interface ChartSeries {
	label: string;
	points: { x: number; y: number }[];
	colour: string;
	dash?: number[];
	axis?: 'y' | 'y2';
	/** points without a line, for measured data */
	scatter?: boolean;
}
