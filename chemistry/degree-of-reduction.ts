/**
 * Degree of reduction γ: electrons a compound can give up on full oxidation to the reference
 * compounds CO2, H2O, the nitrogen source, H3PO4 and H2SO4. Convention (Roels 1983, Energetics and
 * Kinetics in Biotechnology; Erickson, Minkevich & Eroshin 1978 — citations from memory):
 * C +4, H +1, O −2, N −3 with NH3 as nitrogen reference (0 for N2, +5 for nitrate), P +5, S +6.
 * γ is reported per C-mol for carbon compounds and per mole otherwise (O2: −4, NH3: 0).
 */
import { ChemistryInputError } from './errors';
import { parseFormula } from './formula';

export type NitrogenReference = 'ammonia' | 'dinitrogen' | 'nitrate';

const NITROGEN_VALENCE: Record<NitrogenReference, number> = {
	ammonia: -3,
	dinitrogen: 0,
	nitrate: 5
};

export const REDUCTION_VALENCES: Readonly<Record<string, number>> = {
	C: 4,
	H: 1,
	O: -2,
	N: -3,
	P: 5,
	S: 6
};

/** Elements the convention defines a reference valence for. */
export const REDUCTION_ELEMENTS = Object.keys(REDUCTION_VALENCES);

export function valencesFor(
	nitrogenReference: NitrogenReference = 'ammonia'
): Record<string, number> {
	return { ...REDUCTION_VALENCES, N: NITROGEN_VALENCE[nitrogenReference] };
}

export interface DegreeOfReduction {
	/** γ per C-mol for carbon compounds, per mole otherwise. */
	value: number;
	basis: 'perCmol' | 'perMol';
	/** γ per formula unit as written. */
	perMol: number;
	nitrogenReference: NitrogenReference;
}

/**
 * γ of a formula text or element-count map. Elements outside C, H, O, N, P, S have no reference
 * valence in the convention, so they are refused rather than guessed.
 */
export function computeDegreeOfReduction(
	formula: string | Record<string, number>,
	options: { nitrogenReference?: NitrogenReference; field?: string } = {}
): DegreeOfReduction {
	const nitrogenReference = options.nitrogenReference ?? 'ammonia';
	if (!(nitrogenReference in NITROGEN_VALENCE)) {
		throw new ChemistryInputError(
			`Unknown nitrogen reference '${String(nitrogenReference)}'; use 'ammonia', 'dinitrogen' or 'nitrate'`,
			{ field: 'nitrogenReference' }
		);
	}
	const elements = typeof formula === 'string' ? parseFormula(formula).elements : formula;
	const valences = valencesFor(nitrogenReference);
	let perMol = 0;
	for (const [symbol, count] of Object.entries(elements)) {
		const valence = valences[symbol];
		if (valence === undefined) {
			throw new ChemistryInputError(
				`Element ${symbol} has no reference valence in the degree-of-reduction convention (only C, H, O, N, P, S)`,
				{ field: options.field ?? 'formula' }
			);
		}
		perMol += valence * count;
	}
	const carbon = elements.C ?? 0;
	return carbon > 0
		? { value: perMol / carbon, basis: 'perCmol', perMol, nitrogenReference }
		: { value: perMol, basis: 'perMol', perMol, nitrogenReference };
}
