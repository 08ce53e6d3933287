import { findBiomassAllowedG, findStretch, type RunoutInput } from './nutrient-runout';

/** The simulated course held to what the required nutrients supply. */
export interface NutrientHold {
	/** X at each output time, held to what the required nutrients allow, g/L. */
	biomassGPerL: number[];
	/**
	 * The most dry biomass the holding lines allow at each time, g (never below the inoculum, whose
	 * cells are there already); Infinity where no line holds.
	 */
	heldToG: number[];
	/** When a nutrient first holds growth back, h; null when none ever does. */
	fromH: number | null;
	/** Index in `lines` of the nutrient that holds it back then; null when none does. */
	lineIndex: number | null;
}

/**
 * The run's biomass held to its nutrients by the law of the minimum (Sprengel 1828, von Liebig 1840):
 * growth takes each required nutrient at its demand per g of biomass, so the culture cannot hold
 * more biomass than the scarcest of them allows by then, min over lines of supply(t)/r
 * (`findBiomassAllowedG`). The simulated course grows on the carbon source alone; this caps its
 * biomass, X_held(t) = min(X(t)·V(t), allowed(t)) / V(t). A feed that brings more lifts the cap as it
 * delivers. `holding[i]` says which lines can hold growth (required lines, not the modelled carbon
 * source). Biomass never falls in a batch or fed-batch run, so neither does the held course.
 */
export function holdToNutrients(input: RunoutInput, holding: boolean[]): NutrientHold {
	const { t, biomassGPerL, volumeL } = input.course;
	const allowedG = findBiomassAllowedG(input);
	const inoculumG = biomassGPerL[0] * volumeL[0];
	const lines = allowedG.map((_, k) => k).filter((k) => holding[k]);
	const heldToG = t.map((_, i) => {
		const scarcest = Math.min(...lines.map((k) => allowedG[k][i]));
		return Math.max(inoculumG, scarcest);
	});
	const massG = t.map((_, i) => biomassGPerL[i] * volumeL[i]);
	const held = massG.map((m, i) => Math.min(m, heldToG[i]) / volumeL[i]);
	const finite = heldToG.every(Number.isFinite);
	const stretch = finite ? findStretch(t, [massG.map((m, i) => m - heldToG[i])]) : null;
	if (stretch === null) return { biomassGPerL: held, heldToG, fromH: null, lineIndex: null };
	const at = Math.max(
		0,
		t.findIndex((h) => h >= stretch.shortFromH)
	);
	const lineIndex = lines.reduce((a, b) => (allowedG[b][at] < allowedG[a][at] ? b : a));
	return { biomassGPerL: held, heldToG, fromH: stretch.shortFromH, lineIndex };
}
