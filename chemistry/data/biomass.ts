/**
 * Published biomass compositions: elemental mass fractions of dry biomass (ash included in the dry
 * mass) and, for cells, dry mass per cell. Each value carries its confidence:
 * 'confirmed' = printed in the cited source; 'derived' = computed here from confirmed inputs
 * (IUPAC 2021 atomic weights); 'from memory' = recalled, not checked against the source — replace
 * with measured values for your organism when you have them.
 *
 * Sources
 * - Bacterium: Neidhardt, Ingraham & Schaechter (1990), Physiology of the Bacterial Cell, p. 3
 *   (O 20 % confirmed via BioNumbers BNID 100650; N, H, P, S confirmed as listed in our reference
 *   sheet; C, K, Na, Ca, Mg, Cl, Fe from memory). Tempest, Dicks & Hunter (1966), as quoted by
 *   Stouthamer (1973, Antonie van Leeuwenhoek 39:545), give K ≈ 1.5 %, Mg ≈ 0.2 %, P ≈ 2.4 % for
 *   bacteria grown elsewhere — composition shifts with growth conditions.
 *   Dry mass 280 fg per E. coli B/r cell, 40-min doubling on glucose (Neidhardt & Umbarger 1996,
 *   BioNumbers BNID 103904).
 * - Yeast: elemental formula CH1.61O0.56N0.16 for budding yeast (BioNumbers BNID 101801, as in
 *   Milo & Phillips, Cell Biology by the Numbers); C, H, O, N fractions derived from it with an ash
 *   fraction of 6 % (from memory); minerals from memory.
 * - Mammalian (CHO-type) cells: no elemental analysis at hand; the organic part uses the average
 *   microbial formula CH1.79O0.50N0.20 (Roels 1983) as a stand-in, with ash, minerals and dry mass per
 *   cell from memory. Treat it as a placeholder.
 * Trace elements (Zn, Mn, Cu, Co, Mo) are given only where a value is recalled; add your own.
 */
import { ATOMIC_WEIGHTS } from './atomic-weights';

export type Confidence = 'confirmed' | 'derived' | 'from memory';

export interface SourcedValue {
	value: number;
	confidence: Confidence;
}

export interface BiomassComposition {
	id: string;
	name: string;
	group: 'bacterium' | 'yeast' | 'mammalian';
	/** Ash-free elemental formula per C-mol, when one is published. */
	formula: string | null;
	ashFraction: SourcedValue | null;
	cellDryMassPg: SourcedValue | null;
	/** g element per g dry biomass. */
	massFractions: Readonly<Record<string, SourcedValue>>;
	source: string;
}

/** The standard biomass formula (Roels 1983; Heijnen): 24.626 g per ash-free C-mol. */
export const STANDARD_BIOMASS_FORMULA = 'CH1.8O0.5N0.2';
/** Average over organisms, γ = 4.19 (Roels 1983, as tabulated in Doran's textbook). */
export const AVERAGE_BIOMASS_FORMULA = 'CH1.79O0.5N0.2';

const c = (value: number): SourcedValue => ({ value, confidence: 'confirmed' });
const m = (value: number): SourcedValue => ({ value, confidence: 'from memory' });

/**
 * Mass fraction of each element of an ash-free per-C-mol formula in dry biomass that holds
 * `ashFraction` g ash per g: (A_el · n_el / M_formula) · (1 − ash).
 */
export function organicMassFractions(
	counts: Record<string, number>,
	ashFraction: number
): Record<string, number> {
	let molarMass = 0;
	for (const [el, n] of Object.entries(counts)) molarMass += ATOMIC_WEIGHTS[el] * n;
	return Object.fromEntries(
		Object.entries(counts).map(([el, n]) => [el, ((ATOMIC_WEIGHTS[el] * n) / molarMass) * (1 - ashFraction)])
	);
}

/** Mass fractions of C, H, O, N from a per-C-mol formula, scaled by (1 − ash). */
function deriveOrganicFractions(
	counts: Record<string, number>,
	ashFraction: number
): Record<string, SourcedValue> {
	return Object.fromEntries(
		Object.entries(organicMassFractions(counts, ashFraction)).map(([el, value]) => [
			el,
			{ value, confidence: 'derived' as const }
		])
	);
}

const YEAST_ASH = 0.06;
const MAMMALIAN_ASH = 0.07;

export const BIOMASS_COMPOSITIONS: readonly BiomassComposition[] = [
	{
		id: 'bacterium-neidhardt-1990',
		name: 'Bacterium (E. coli-type), Neidhardt, Ingraham & Schaechter 1990',
		group: 'bacterium',
		formula: null,
		ashFraction: null,
		cellDryMassPg: c(0.28),
		massFractions: {
			C: m(0.5),
			O: c(0.2),
			N: c(0.14),
			H: c(0.08),
			P: c(0.03),
			S: c(0.01),
			K: m(0.01),
			Na: m(0.01),
			Ca: m(0.005),
			Mg: m(0.005),
			Cl: m(0.005),
			Fe: m(0.002)
		},
		source:
			'Neidhardt, Ingraham & Schaechter (1990) Physiology of the Bacterial Cell; dry mass per cell Neidhardt & Umbarger (1996)'
	},
	{
		id: 'yeast-bionumbers-101801',
		name: 'Budding yeast, CH1.61O0.56N0.16',
		group: 'yeast',
		formula: 'CH1.61O0.56N0.16',
		ashFraction: m(YEAST_ASH),
		cellDryMassPg: m(15),
		massFractions: {
			...deriveOrganicFractions({ C: 1, H: 1.61, O: 0.56, N: 0.16 }, YEAST_ASH),
			P: m(0.012),
			K: m(0.018),
			S: m(0.004),
			Mg: m(0.0015),
			Ca: m(0.001),
			Fe: m(0.0001),
			Zn: m(0.0001)
		},
		source: 'Formula: BioNumbers BNID 101801; ash, minerals and dry mass per cell from memory'
	},
	{
		id: 'mammalian-cho-placeholder',
		name: 'Mammalian cell (CHO-type), placeholder',
		group: 'mammalian',
		formula: AVERAGE_BIOMASS_FORMULA,
		ashFraction: m(MAMMALIAN_ASH),
		cellDryMassPg: m(300),
		massFractions: {
			...deriveOrganicFractions({ C: 1, H: 1.79, O: 0.5, N: 0.2 }, MAMMALIAN_ASH),
			P: m(0.015),
			S: m(0.008),
			K: m(0.012),
			Mg: m(0.0012),
			Ca: m(0.001),
			Fe: m(0.0002)
		},
		source:
			'Organic part: average formula of Roels (1983) as a stand-in; ash, minerals, dry mass from memory'
	}
];

export function findBiomassComposition(id: string): BiomassComposition | undefined {
	return BIOMASS_COMPOSITIONS.find((b) => b.id === id);
}
