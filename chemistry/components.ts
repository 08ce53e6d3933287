/**
 * Components as the science sees them: a formula or elemental mass fractions, the ions a salt gives,
 * an osmotic coefficient and a solubility. `ComponentSpec` is what the composition engine takes, so
 * components stored by the app work as well as the reference ones.
 */
import { resolveComponent } from './resolve-component';
import { toKelvin } from './units';
export { resolveComponent } from './resolve-component';
export {
	REFERENCE_COMPONENTS,
	findReferenceComponent,
	findHydratesOf
} from './reference-components';

export type ComponentCategory =
	| 'salt'
	| 'trace-metal'
	| 'sugar'
	| 'polyol'
	| 'amino-acid'
	| 'vitamin'
	| 'buffer'
	| 'complex'
	| 'other';

/** One species a formula unit dissolves into; `ion` is a label such as 'Na+' or 'HPO4^2-'. */
export interface IonSpec {
	ion: string;
	count: number;
	charge: number;
}

export interface GhsHazard {
	code: string;
	text: string;
}

export interface SolubilityPoint {
	temperatureC: number;
	gPerL: number;
}

export interface SolubilitySpec {
	/** Grams of the basis form per litre of water, at one or more temperatures. */
	points: SolubilityPoint[];
	/** Formula of the form the values refer to (the anhydrous salt), when not the component itself. */
	basisFormula?: string | null;
	source?: string | null;
}

export interface ComponentSpec {
	id: string;
	name: string;
	formula?: string | null;
	/** For a material without a formula but with a known (average) molar mass. */
	molarMassGPerMol?: number | null;
	/** g of element per g of material, for complex materials without a formula. */
	elementalMassFractions?: Record<string, number> | null;
	/** Omitted or null: a non-electrolyte, one uncharged particle per formula unit. */
	ions?: IonSpec[] | null;
	osmoticCoefficient?: number | null;
	osmoticCoefficientSource?: string | null;
	solubility?: SolubilitySpec | null;
}

export interface ReferenceComponent extends ComponentSpec {
	category: ComponentCategory;
	casNumber?: string;
	synonyms?: string[];
	formula: string | null;
	molarMassGPerMol: number | null;
	osmoticCoefficient: number;
	osmoticCoefficientSource: string;
	/** The 25 °C solubility of the basis form, as tabulated, for display. */
	solubilityGPerL25C?: number;
	solubilitySource?: string;
	anhydrousId?: string;
	freeFormId?: string;
	ghsHazards?: GhsHazard[];
	hazardSource?: string;
	fractionsNote?: string;
	fractionsSource?: string;
}

/** A component checked and reduced to the numbers the composition engine needs. */
export interface ResolvedComponent {
	spec: ComponentSpec;
	molarMassGPerMol: number | null;
	/** Parallel arrays (shared between components of one formula): symbols, g and mol element per g. */
	readonly elementSymbols: readonly string[];
	readonly elementGPerG: readonly number[];
	readonly elementMolPerG: readonly number[];
	ions: IonSpec[];
	/** Dissolved particles per formula unit (ν); null without a molar mass. */
	particlesPerUnit: number | null;
	/** ½ Σ n z² per formula unit: ionic strength per mol/L of component. */
	ionicStrengthPerMolar: number;
	osmoticCoefficient: number;
	osmoticCoefficientSource: string;
	solubility: {
		points: SolubilityPoint[];
		basisMolarMassGPerMol: number | null;
		source: string;
	} | null;
}

/** The base of an ion label without its charge: 'HPO4^2-' → 'HPO4', 'Na+' → 'Na'. */
export function ionBase(label: string): string {
	return label.replace(/\^\d+[+-]$|[+-]$/, '');
}

/** g of each element per g of the component. */
export function elementsPerGram(spec: ComponentSpec): Record<string, number> {
	const resolved = resolveComponent(spec);
	const out: Record<string, number> = {};
	resolved.elementSymbols.forEach((symbol, i) => (out[symbol] = resolved.elementGPerG[i]));
	return out;
}

/**
 * Solubility (g of the basis form per L water) at a temperature. Between sourced points ln S is
 * interpolated linearly in 1/T, the van 't Hoff form; outside them the nearest point is used.
 */
export function solubilityAt(
	points: SolubilityPoint[],
	temperatureC: number
): { gPerL: number; exact: boolean; withinRange: boolean } {
	const sorted = [...points].sort((a, b) => a.temperatureC - b.temperatureC);
	const first = sorted[0];
	const last = sorted[sorted.length - 1];
	const exactPoint = sorted.find((p) => Math.abs(p.temperatureC - temperatureC) < 1e-9);
	if (exactPoint) return { gPerL: exactPoint.gPerL, exact: true, withinRange: true };
	if (temperatureC < first.temperatureC)
		return { gPerL: first.gPerL, exact: false, withinRange: false };
	if (temperatureC > last.temperatureC)
		return { gPerL: last.gPerL, exact: false, withinRange: false };
	for (let i = 1; i < sorted.length; i++) {
		const a = sorted[i - 1];
		const b = sorted[i];
		if (temperatureC <= b.temperatureC) {
			const invT = 1 / toKelvin(temperatureC);
			const invA = 1 / toKelvin(a.temperatureC);
			const invB = 1 / toKelvin(b.temperatureC);
			const fraction = (invT - invA) / (invB - invA);
			const lnS = Math.log(a.gPerL) + fraction * (Math.log(b.gPerL) - Math.log(a.gPerL));
			return { gPerL: Math.exp(lnS), exact: false, withinRange: true };
		}
	}
	return { gPerL: last.gPerL, exact: false, withinRange: false };
}
