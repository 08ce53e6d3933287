/**
 * The nine GHS pictograms, drawn here from their description in the UN GHS (Rev. 10, 1.4.10.5.2
 * and Annex 1): a black symbol on a white ground inside a red square set on a point. Each is a
 * list of filled paths in a 100 × 100 box, painted in order (the later over the earlier), so
 * the same data draws as inline SVG and in a PDF (pictogram-pdf.ts).
 */
import type { PictogramId } from '$chemistry';
import { path } from './svg-path';
import {
	bombSymbol,
	corrosionSymbol,
	environmentSymbol,
	exclamationSymbol,
	flameOverCircleSymbol,
	flameSymbol,
	gasCylinderSymbol,
	healthHazardSymbol,
	skullSymbol
} from './ghs-symbols';

export type PictogramFill = 'black' | 'red' | 'white';

export interface PictogramPath {
	d: string;
	fill: PictogramFill;
}

export interface Pictogram {
	id: PictogramId;
	/** Plain words, for the accessible name and the printed legend. */
	name: string;
	paths: PictogramPath[];
}

/** The red of the frame: the standard asks for red, not for a shade; this is a full signal red. */
export const PICTOGRAM_COLOURS: Readonly<Record<PictogramFill, readonly [number, number, number]>> =
	{
		black: [0, 0, 0],
		red: [0.89, 0, 0.1],
		white: [1, 1, 1]
	};

export function pictogramCssColour(fill: PictogramFill): string {
	const [r, g, b] = PICTOGRAM_COLOURS[fill].map((c) => Math.round(c * 255));
	return `rgb(${r} ${g} ${b})`;
}

/** The red diamond with its white ground; the border is wide enough to read at 16 px. */
function frame(): PictogramPath[] {
	const diamond = (half: number) =>
		path()
			.polygon([
				[50, 50 - half],
				[50 + half, 50],
				[50, 50 + half],
				[50 - half, 50]
			])
			.toString();
	return [
		{ d: diamond(48.5), fill: 'red' },
		{ d: diamond(40), fill: 'white' }
	];
}

function pictogram(id: PictogramId, name: string, symbol: PictogramPath[]): Pictogram {
	return { id, name, paths: [...frame(), ...symbol] };
}

export const GHS_PICTOGRAMS: Readonly<Record<PictogramId, Pictogram>> = Object.freeze({
	GHS01: pictogram('GHS01', 'Exploding bomb', bombSymbol()),
	GHS02: pictogram('GHS02', 'Flame', flameSymbol()),
	GHS03: pictogram('GHS03', 'Flame over circle', flameOverCircleSymbol()),
	GHS04: pictogram('GHS04', 'Gas cylinder', gasCylinderSymbol()),
	GHS05: pictogram('GHS05', 'Corrosion', corrosionSymbol()),
	GHS06: pictogram('GHS06', 'Skull and crossbones', skullSymbol()),
	GHS07: pictogram('GHS07', 'Exclamation mark', exclamationSymbol()),
	GHS08: pictogram('GHS08', 'Health hazard', healthHazardSymbol()),
	GHS09: pictogram('GHS09', 'Environment', environmentSymbol())
});
