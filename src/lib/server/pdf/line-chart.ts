import { rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { formatTick, timeAxis, valueAxis, type AxisTicks } from './chart-scale';
import { drawLegend, layLegend, LEGEND_ROW_PT, type LegendEntry } from './chart-legend';
import type { PdfFonts } from './fonts';
import { fitTextToFont } from './text-fit';

export type Rgb = [number, number, number];

/** How a line is drawn: a colour and a dash, so that each line reads apart in black and white too. */
export interface LineStyle {
	color: Rgb;
	/** Dash and gap lengths, pt; none for a solid line. */
	dashPt?: number[];
	widthPt?: number;
}

export interface ChartSeries {
	label: string;
	xs: number[];
	ys: number[];
	style: LineStyle;
}

/** A horizontal line across the whole plot at one value (a limit or a target). */
export interface ChartLevel {
	label: string;
	value: number;
	style: LineStyle;
}

/** A span of x shaded across the plot, such as the hours with DO at 0. */
export interface ChartBand {
	fromX: number;
	toX: number;
}

export interface LineChartSpec {
	/** The chart's title with the unit of its y axis. */
	title: string;
	xLabel: string;
	/** The x axis runs from 0 to here: the run's end. */
	xEnd: number;
	series: ChartSeries[];
	levels?: ChartLevel[];
	bands?: ChartBand[];
	bandLabel?: string;
}

/** Where a chart goes: its left edge, top, width, and the height of the plot itself, pt. */
export interface ChartFrame {
	x: number;
	top: number;
	widthPt: number;
	plotHeightPt: number;
}

const TITLE_PT = 8.5;
const TICK_PT = 7;
const TICK_LENGTH_PT = 3;
const AXIS_COLOR = rgb(0.2, 0.2, 0.2);
const GRID_COLOR = rgb(0.85, 0.85, 0.85);
const BAND_RGB: Rgb = [0.88, 0.9, 0.96];
const BAND_COLOR = rgb(...BAND_RGB);
/** Below the plot: tick labels, then the x-axis label. */
const BELOW_PLOT_PT = TICK_LENGTH_PT + 2 + TICK_PT + 3 + TICK_PT + 6;
const ABOVE_PLOT_PT = TITLE_PT + 6;

interface Plot {
	left: number;
	bottom: number;
	widthPt: number;
	heightPt: number;
	x: AxisTicks;
	y: AxisTicks;
}

const toPageX = (plot: Plot, value: number) =>
	plot.left + (Math.min(Math.max(value, 0), plot.x.endValue) / plot.x.endValue) * plot.widthPt;
const toPageY = (plot: Plot, value: number) =>
	plot.bottom + (Math.min(Math.max(value, 0), plot.y.endValue) / plot.y.endValue) * plot.heightPt;

function legendEntries(spec: LineChartSpec): LegendEntry[] {
	return [
		...spec.series.map((s) => ({ label: s.label, style: s.style })),
		...(spec.levels ?? []).map((l) => ({ label: l.label, style: l.style })),
		...(spec.bands?.length && spec.bandLabel ? [{ label: spec.bandLabel, swatch: BAND_RGB }] : [])
	];
}

/** The chart's whole height, pt: title, plot, axis labels and legend. */
export function measureLineChartPt(
	fonts: PdfFonts,
	widthPt: number,
	spec: LineChartSpec,
	plotHeightPt: number
): number {
	const rows = layLegend(fonts.font, legendEntries(spec), widthPt).length;
	return ABOVE_PLOT_PT + plotHeightPt + BELOW_PLOT_PT + rows * LEGEND_ROW_PT;
}

/** The points of a series up to the axis's end, as one SVG path relative to the plot's corner. */
function seriesPath(plot: Plot, xs: number[], ys: number[]): string {
	const steps: string[] = [];
	for (let i = 0; i < xs.length; i++) {
		if (!Number.isFinite(xs[i]) || !Number.isFinite(ys[i])) continue;
		if (xs[i] > plot.x.endValue + 1e-9) break;
		const dx = toPageX(plot, xs[i]) - plot.left;
		const dy = toPageY(plot, ys[i]) - plot.bottom;
		steps.push(`${steps.length ? 'L' : 'M'}${dx.toFixed(2)} ${(-dy).toFixed(2)}`);
	}
	return steps.join(' ');
}

function strokeOptions(style: LineStyle) {
	return {
		borderColor: rgb(...style.color),
		borderWidth: style.widthPt ?? 1.2,
		borderDashArray: style.dashPt
	};
}

function drawData(page: PDFPage, plot: Plot, spec: LineChartSpec): void {
	for (const level of spec.levels ?? []) {
		if (!Number.isFinite(level.value)) continue;
		const y = toPageY(plot, level.value);
		page.drawLine({
			start: { x: plot.left, y },
			end: { x: plot.left + plot.widthPt, y },
			thickness: level.style.widthPt ?? 1.2,
			color: rgb(...level.style.color),
			dashArray: level.style.dashPt
		});
	}
	for (const series of spec.series) {
		const path = seriesPath(plot, series.xs, series.ys);
		if (path)
			page.drawSvgPath(path, { x: plot.left, y: plot.bottom, ...strokeOptions(series.style) });
	}
}

function drawBandsAndGrid(page: PDFPage, plot: Plot, bands: ChartBand[]): void {
	for (const band of bands) {
		const from = toPageX(plot, band.fromX);
		const to = toPageX(plot, band.toX);
		if (to > from)
			page.drawRectangle({
				x: from,
				y: plot.bottom,
				width: to - from,
				height: plot.heightPt,
				color: BAND_COLOR
			});
	}
	for (const tick of plot.y.ticks.slice(1)) {
		const y = toPageY(plot, tick);
		page.drawLine({
			start: { x: plot.left, y },
			end: { x: plot.left + plot.widthPt, y },
			thickness: 0.4,
			color: GRID_COLOR
		});
	}
}

function drawAxes(page: PDFPage, font: PDFFont, plot: Plot, xLabel: string): void {
	const { left, bottom } = plot;
	const line = (x1: number, y1: number, x2: number, y2: number, thickness = 0.7) =>
		page.drawLine({ start: { x: x1, y: y1 }, end: { x: x2, y: y2 }, thickness, color: AXIS_COLOR });
	const label = (text: string, x: number, y: number) =>
		page.drawText(text, { x, y, size: TICK_PT, font, color: AXIS_COLOR });
	line(left, bottom, left + plot.widthPt, bottom);
	line(left, bottom, left, bottom + plot.heightPt);
	for (const tick of plot.x.ticks) {
		const x = toPageX(plot, tick);
		const text = formatTick(tick, plot.x.step);
		line(x, bottom, x, bottom - TICK_LENGTH_PT, 0.5);
		label(
			text,
			x - font.widthOfTextAtSize(text, TICK_PT) / 2,
			bottom - TICK_LENGTH_PT - 2 - TICK_PT
		);
	}
	for (const tick of plot.y.ticks) {
		const y = toPageY(plot, tick);
		const text = formatTick(tick, plot.y.step);
		line(left, y, left - TICK_LENGTH_PT, y, 0.5);
		label(text, left - TICK_LENGTH_PT - 2 - font.widthOfTextAtSize(text, TICK_PT), y - TICK_PT / 3);
	}
	const fitted = fitTextToFont(font, xLabel);
	const labelY = bottom - TICK_LENGTH_PT - 2 - TICK_PT - 3 - TICK_PT;
	label(fitted, left + (plot.widthPt - font.widthOfTextAtSize(fitted, TICK_PT)) / 2, labelY);
}

/** The y axis: from 0 to a round number above every series and level drawn. */
function yAxisOf(spec: LineChartSpec): AxisTicks {
	const values = [
		...spec.series.flatMap((s) => s.ys.filter((_, i) => s.xs[i] <= spec.xEnd + 1e-9)),
		...(spec.levels ?? []).map((l) => l.value)
	].filter(Number.isFinite);
	return valueAxis(values.length ? Math.max(...values) : 0);
}

function layPlot(font: PDFFont, frame: ChartFrame, spec: LineChartSpec): Plot {
	const y = yAxisOf(spec);
	const x = timeAxis(spec.xEnd);
	const widest = Math.max(
		...y.ticks.map((t) => font.widthOfTextAtSize(formatTick(t, y.step), TICK_PT))
	);
	const left = frame.x + widest + TICK_LENGTH_PT + 4;
	// Room at the right for half of the last time label.
	const right = frame.x + frame.widthPt - 8;
	const top = frame.top - ABOVE_PLOT_PT;
	return {
		left,
		bottom: top - frame.plotHeightPt,
		widthPt: right - left,
		heightPt: frame.plotHeightPt,
		x,
		y
	};
}

/**
 * A line chart drawn in vector: title, axes with ticks and labels, light grid, shaded bands, one line
 * per series in its colour and dash, horizontal levels, and a legend below. Returns its height, pt.
 */
export function drawLineChart(
	page: PDFPage,
	fonts: PdfFonts,
	frame: ChartFrame,
	spec: LineChartSpec
): number {
	const plot = layPlot(fonts.font, frame, spec);
	page.drawText(fitTextToFont(fonts.bold, spec.title), {
		x: frame.x,
		y: frame.top - TITLE_PT,
		size: TITLE_PT,
		font: fonts.bold
	});
	drawBandsAndGrid(page, plot, spec.bands ?? []);
	drawData(page, plot, spec);
	drawAxes(page, fonts.font, plot, spec.xLabel);
	const legendTop = plot.bottom - BELOW_PLOT_PT;
	const rows = layLegend(fonts.font, legendEntries(spec), frame.widthPt);
	drawLegend(page, fonts.font, rows, frame.x, legendTop);
	return measureLineChartPt(fonts, frame.widthPt, spec, frame.plotHeightPt);
}
