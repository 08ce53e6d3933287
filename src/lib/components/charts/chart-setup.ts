import {
	Chart,
	Decimation,
	Legend,
	LinearScale,
	LineController,
	LineElement,
	LogarithmicScale,
	PointElement,
	ScatterController,
	Tooltip,
	type Plugin
} from 'chart.js';
import type { ChartMarker } from './chart-types';

Chart.register(
	LineController,
	ScatterController,
	LineElement,
	PointElement,
	LinearScale,
	LogarithmicScale,
	Legend,
	Tooltip,
	Decimation
);

export { Chart };
export type { ChartMarker, ChartSeries, ChartSpec } from './chart-types';

const MARKER_STYLES = {
	event: { line: '#a65d16', text: '#663817', dash: [4, 3], width: 1 },
	chosen: { line: '#14332e', text: '#14332e', dash: [], width: 2 }
} as const;

/**
 * Vertical lines with a short label, for run events and marked operating points. A label runs to the
 * right of its line unless it would leave the plot, then to the left, so it is never cut off; where
 * each was drawn is written on the canvas (`data-markers`, with `data-chart-area`) for tests to read.
 */
export function createMarkerPlugin(markers: () => ChartMarker[]): Plugin<'line'> {
	return {
		id: 'brothwrightMarkers',
		afterDatasetsDraw(chart) {
			const { ctx, chartArea, scales } = chart;
			const { left, right, top, bottom } = chartArea;
			const x = scales.x;
			const drawn: { label: string; kind: string; left: number; right: number; top: number }[] = [];
			ctx.save();
			ctx.font = '11px Lexend, system-ui, sans-serif';
			markers().forEach((marker, i) => {
				const px = x.getPixelForValue(marker.x);
				if (px < left - 0.5 || px > right + 0.5) return;
				const kind = marker.kind ?? 'event';
				const style = MARKER_STYLES[kind];
				ctx.strokeStyle = style.line;
				ctx.setLineDash([...style.dash]);
				ctx.lineWidth = style.width;
				ctx.beginPath();
				ctx.moveTo(px, top);
				ctx.lineTo(px, bottom);
				ctx.stroke();
				const width = ctx.measureText(marker.label).width;
				const textX = px + 3 + width <= right ? px + 3 : Math.max(left, px - 3 - width);
				// Labels step down so neighbouring events do not print over each other.
				const textY = top + 11 + (i % 4) * 12;
				// A pale ground keeps the label legible where it crosses a series.
				ctx.fillStyle = 'rgba(255, 255, 255, 0.85)';
				ctx.fillRect(textX - 2, textY - 10, width + 4, 13);
				ctx.fillStyle = style.text;
				ctx.fillText(marker.label, textX, textY);
				drawn.push({
					label: marker.label,
					kind,
					left: textX,
					right: textX + width,
					top: textY - 9
				});
			});
			ctx.restore();
			chart.canvas.dataset.markers = JSON.stringify(drawn);
			chart.canvas.dataset.chartArea = JSON.stringify({ left, right, top, bottom });
		}
	};
}

/**
 * Writes what the chart actually drew on its canvas: the x axis's range, the left axis's type and each
 * dataset's style and extent (`data-x-min`, `data-x-max`, `data-y-scale`, `data-datasets`), so the
 * browser tests read the chart itself rather than what was asked of it.
 */
export const chartFactsPlugin: Plugin<'line'> = {
	id: 'brothwrightChartFacts',
	afterUpdate(chart) {
		const { canvas, scales, data } = chart;
		canvas.dataset.xMin = String(scales.x.min);
		canvas.dataset.xMax = String(scales.x.max);
		canvas.dataset.yScale = scales.y.type;
		canvas.dataset.datasets = JSON.stringify(
			data.datasets.map((d) => {
				const ys = (d.data as { x: number; y: number }[]).map((p) => p.y);
				return {
					label: d.label,
					colour: d.borderColor,
					dash: d.borderDash ?? [],
					line: d.showLine !== false,
					pointStyle: d.pointStyle ?? 'circle',
					axis: d.yAxisID,
					maxY: ys.length ? Math.max(...ys) : null,
					lastY: ys.at(-1) ?? null,
					lastX: (d.data as { x: number }[]).at(-1)?.x ?? null
				};
			})
		);
	}
};
