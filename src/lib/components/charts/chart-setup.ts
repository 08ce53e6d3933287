import {
	Chart,
	Decimation,
	Legend,
	LinearScale,
	LineController,
	LineElement,
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
	Legend,
	Tooltip,
	Decimation
);

export { Chart };
export type { ChartMarker, ChartSeries } from './chart-types';

/** Dashed vertical lines with a short label, for run events and marked operating points. */
export function createMarkerPlugin(markers: () => ChartMarker[]): Plugin<'line'> {
	return {
		id: 'brothwrightMarkers',
		afterDatasetsDraw(chart) {
			const { ctx, chartArea, scales } = chart;
			const x = scales.x;
			ctx.save();
			ctx.font = '11px Lexend, system-ui, sans-serif';
			markers().forEach((marker, i) => {
				const px = x.getPixelForValue(marker.x);
				if (px < chartArea.left || px > chartArea.right) return;
				ctx.strokeStyle = '#a65d16';
				ctx.fillStyle = '#663817';
				ctx.setLineDash([4, 3]);
				ctx.lineWidth = 1;
				ctx.beginPath();
				ctx.moveTo(px, chartArea.top);
				ctx.lineTo(px, chartArea.bottom);
				ctx.stroke();
				// Labels step down so neighbouring events do not print over each other.
				ctx.fillText(marker.label, px + 3, chartArea.top + 11 + (i % 4) * 12);
			});
			ctx.restore();
		}
	};
}
