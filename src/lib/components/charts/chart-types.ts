// Chart shapes and styles without Chart.js itself, so pure modules (and a PDF) can build chart data.

/**
 * A vertical line with a short label: a run's event, or the operating point the user chose
 * (`chosen`, drawn solid and darker so it stands apart from what the model found).
 */
export interface ChartMarker {
	x: number;
	label: string;
	kind?: 'event' | 'chosen';
}

/** Series colours: ink-green, grain, slate blue, brick, moss, plum; a second scenario reuses them dashed. */
export const SERIES_COLOURS = ['#1d4c45', '#c8791c', '#3b5b8c', '#9c3d2e', '#5a7d2a', '#6b4c8a'];
export const SCENARIO_DASHES: number[][] = [[], [7, 4], [2, 3]];
/** What a chart shows beyond what it vouches for (a course past a nutrient's limit) is drawn in this grey. */
export const BEYOND_COLOUR = '#9a9a92';
export const BEYOND_DASH = [3, 3];

export interface ChartSeries {
	label: string;
	points: { x: number; y: number }[];
	colour: string;
	dash?: number[];
	/** y: the left axis; y2 and y3: the first and second axes on the right */
	axis?: 'y' | 'y2' | 'y3';
	/** points without a line, for measured data */
	scatter?: boolean;
	/** the measured points' shape, so two measured series differ in more than colour */
	pointStyle?: 'circle' | 'rect' | 'triangle';
	/** from this x on the line is drawn grey and dashed: the model's course past what the chart vouches for */
	greyFromX?: number;
}

/** What a chart shows and over what range: one description for the page's canvas and a PDF alike. */
export interface ChartSpec {
	id: string;
	title: string;
	xTitle: string;
	yTitle: string;
	y2Title?: string;
	y3Title?: string;
	series: ChartSeries[];
	markers: ChartMarker[];
	/** the x axis runs exactly from xMin to xMax (a run's start and end), not to the next round tick */
	xMin?: number;
	xMax?: number;
	/** the left axis is logarithmic, as growth data reads best */
	yLog?: boolean;
}
