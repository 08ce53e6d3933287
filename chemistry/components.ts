/**
 * Components as the science sees them: a formula or elemental mass fractions, the ions a salt gives,
 * an osmotic coefficient and a solubility. `ComponentSpec` is what the composition engine takes, so
 * components stored by the app work as well as the reference ones.
 */
import { ChemistryInputError } from './errors';
import { readMolarMass } from './input';
import { ATOMIC_WEIGHTS } from './data/atomic-weights';
import { molarMassOf, parseFormula } from './formula';
import { REFERENCE_COMPONENTS, normalizeName, lookup, formulaCounts } from './reference-components';
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
for (const component of REFERENCE_COMPONENTS) {
	for (const key of [component.id, component.name, ...(component.synonyms ?? [])]) {
		const normalized = normalizeName(key);
		if (!lookup.has(normalized)) lookup.set(normalized, component);
	}
}
for (const c of REFERENCE_COMPONENTS) {
	if (c.formula)
		formulaCounts.set(
			normalizeName(c.formula),
			(formulaCounts.get(normalizeName(c.formula)) ?? 0) + 1
		);
}
for (const c of REFERENCE_COMPONENTS) {
	const key = c.formula ? normalizeName(c.formula) : null;
	if (key && formulaCounts.get(key) === 1 && !lookup.has(key)) lookup.set(key, c);
}

/** The base of an ion label without its charge: 'HPO4^2-' → 'HPO4', 'Na+' → 'Na'. */
export function ionBase(label: string): string {
	return label.replace(/\^\d+[+-]$|[+-]$/, '');
}

const resolvedCache = new WeakMap<ComponentSpec, ResolvedComponent>();

interface FormulaVector {
	molarMassGPerMol: number;
	symbols: string[];
	gPerG: number[];
	molPerG: number[];
}
// Per formula text, so components loaded afresh from a database still skip parsing.
const formulaCache = new Map<string, FormulaVector>();

function vectorOfFormula(formula: string, field: string): FormulaVector {
	let vector = formulaCache.get(formula);
	if (!vector) {
		let elements: Record<string, number>;
		try {
			elements = parseFormula(formula).elements;
		} catch (e) {
			if (e instanceof ChemistryInputError) {
				throw new ChemistryInputError(`Formula '${formula}': ${e.message}`, {
					field,
					position: e.position
				});
			}
			throw e;
		}
		const molarMassGPerMol = molarMassOf(elements);
		const symbols = Object.keys(elements);
		vector = {
			molarMassGPerMol,
			symbols,
			gPerG: symbols.map((s) => (elements[s] * ATOMIC_WEIGHTS[s]) / molarMassGPerMol),
			molPerG: symbols.map((s) => elements[s] / molarMassGPerMol)
		};
		if (formulaCache.size > 10_000) formulaCache.clear();
		formulaCache.set(formula, vector);
	}
	return vector;
}

function isPositiveFinite(value: unknown): value is number {
	return typeof value === 'number' && Number.isFinite(value) && value > 0;
}

/**
 * Checks a component and reduces it to per-gram element amounts, particles and ionic-strength
 * factors. Results are cached per spec object; `field` prefixes error paths
 * (e.g. 'lines.3.component').
 */
export function resolveComponent(spec: ComponentSpec, field = 'component'): ResolvedComponent {
	const cached = resolvedCache.get(spec);
	if (cached) return cached;
	if (!spec || typeof spec !== 'object')
		throw new ChemistryInputError('Component is missing', { field });
	if (typeof spec.id !== 'string' || spec.id.trim() === '') {
		throw new ChemistryInputError('Component needs an id', { field: `${field}.id` });
	}
	if (typeof spec.name !== 'string' || spec.name.trim() === '') {
		throw new ChemistryInputError('Component needs a name', { field: `${field}.name` });
	}
	const content = readElementContent(spec, field);
	const { molarMassGPerMol } = content;
	const { ions, particles, ionicStrengthPerMolar } = readIons(spec, field, molarMassGPerMol);

	let osmoticCoefficient = 1;
	let osmoticCoefficientSource = 'assumed ideal (φ = 1): none given';
	if (spec.osmoticCoefficient != null) {
		if (!isPositiveFinite(spec.osmoticCoefficient) || spec.osmoticCoefficient > 2) {
			throw new ChemistryInputError('Osmotic coefficient must be a number between 0 and 2', {
				field: `${field}.osmoticCoefficient`
			});
		}
		osmoticCoefficient = spec.osmoticCoefficient;
		osmoticCoefficientSource = spec.osmoticCoefficientSource ?? 'given with the component';
	}

	const resolved: ResolvedComponent = {
		spec,
		...content,
		ions,
		particlesPerUnit: molarMassGPerMol === null ? null : particles,
		ionicStrengthPerMolar,
		osmoticCoefficient,
		osmoticCoefficientSource,
		solubility: spec.solubility != null ? readSolubility(spec, field, molarMassGPerMol) : null
	};
	resolvedCache.set(spec, resolved);
	return resolved;
}

interface ElementContent {
	molarMassGPerMol: number | null;
	elementSymbols: string[];
	elementGPerG: number[];
	elementMolPerG: number[];
}

/** The elements per gram, from the formula or from elemental mass fractions (one of them, not both). */
function readElementContent(spec: ComponentSpec, field: string): ElementContent {
	const hasFormula = spec.formula != null && spec.formula !== '';
	const fractions = spec.elementalMassFractions;
	if (hasFormula && fractions != null) {
		throw new ChemistryInputError('Give either a formula or elemental mass fractions, not both', {
			field: `${field}.elementalMassFractions`
		});
	}
	if (hasFormula) {
		const vector = vectorOfFormula(spec.formula as string, `${field}.formula`);
		const molarMassGPerMol = vector.molarMassGPerMol;
		if (
			spec.molarMassGPerMol != null &&
			!(Math.abs(spec.molarMassGPerMol - molarMassGPerMol) <= 0.01 * molarMassGPerMol)
		) {
			throw new ChemistryInputError(
				`Molar mass ${spec.molarMassGPerMol} g/mol disagrees with the formula's ${molarMassGPerMol.toFixed(3)} g/mol`,
				{ field: `${field}.molarMassGPerMol` }
			);
		}
		return {
			molarMassGPerMol,
			elementSymbols: vector.symbols,
			elementGPerG: vector.gPerG,
			elementMolPerG: vector.molPerG
		};
	}
	const content: ElementContent = {
		molarMassGPerMol: null,
		elementSymbols: [],
		elementGPerG: [],
		elementMolPerG: []
	};
	if (spec.molarMassGPerMol != null) {
		content.molarMassGPerMol = readMolarMass(spec.molarMassGPerMol, `${field}.molarMassGPerMol`);
	}
	if (fractions != null) {
		if (typeof fractions !== 'object') {
			throw new ChemistryInputError(
				'Elemental mass fractions must map element symbols to numbers',
				{
					field: `${field}.elementalMassFractions`
				}
			);
		}
		readElementalMassFractions(fractions, field, content);
	}
	return content;
}

/** Elemental mass fractions (g per g, together at most 1), appended to `content`. */
function readElementalMassFractions(
	fractions: Record<string, number>,
	field: string,
	content: ElementContent
): void {
	const { elementSymbols, elementGPerG, elementMolPerG } = content;
	let sum = 0;
	for (const [symbol, fraction] of Object.entries(fractions)) {
		const fractionField = `${field}.elementalMassFractions.${symbol}`;
		if (ATOMIC_WEIGHTS[symbol] === undefined) {
			throw new ChemistryInputError(`Unknown element '${symbol}'`, { field: fractionField });
		}
		if (
			typeof fraction !== 'number' ||
			!Number.isFinite(fraction) ||
			fraction < 0 ||
			fraction > 1
		) {
			throw new ChemistryInputError(
				`Mass fraction of ${symbol} must be between 0 and 1 (g per g)`,
				{
					field: fractionField
				}
			);
		}
		sum += fraction;
		elementSymbols.push(symbol);
		elementGPerG.push(fraction);
		elementMolPerG.push(fraction / ATOMIC_WEIGHTS[symbol]);
	}
	if (sum > 1 + 1e-6) {
		throw new ChemistryInputError(
			`Elemental mass fractions add up to ${sum.toFixed(4)}, more than 1 g per g`,
			{
				field: `${field}.elementalMassFractions`
			}
		);
	}
}

/** The ions a salt gives (a neutral set), the particles and ionic strength per formula unit. */
function readIons(
	spec: ComponentSpec,
	field: string,
	molarMassGPerMol: number | null
): { ions: IonSpec[]; particles: number; ionicStrengthPerMolar: number } {
	const ions: IonSpec[] = [];
	let particles = 0;
	let ionicStrengthPerMolar = 0;
	let netCharge = 0;
	if (spec.ions != null) {
		if (!Array.isArray(spec.ions)) {
			throw new ChemistryInputError('Ions must be a list', { field: `${field}.ions` });
		}
		if (molarMassGPerMol === null && spec.ions.length > 0) {
			throw new ChemistryInputError('Ions need a formula or molar mass to turn g/L into mol/L', {
				field: `${field}.ions`
			});
		}
		spec.ions.forEach((entry, i) => {
			const ionField = `${field}.ions.${i}`;
			if (!entry || typeof entry.ion !== 'string' || entry.ion.trim() === '') {
				throw new ChemistryInputError('Ion needs a label such as Na+', {
					field: `${ionField}.ion`
				});
			}
			if (!isPositiveFinite(entry.count)) {
				throw new ChemistryInputError(`Count of ${entry.ion} must be a positive number`, {
					field: `${ionField}.count`
				});
			}
			if (!Number.isInteger(entry.charge) || Math.abs(entry.charge) > 10) {
				throw new ChemistryInputError(`Charge of ${entry.ion} must be a whole number`, {
					field: `${ionField}.charge`
				});
			}
			ions.push({ ion: entry.ion, count: entry.count, charge: entry.charge });
			particles += entry.count;
			ionicStrengthPerMolar += 0.5 * entry.count * entry.charge * entry.charge;
			netCharge += entry.count * entry.charge;
		});
		if (Math.abs(netCharge) > 1e-9) {
			throw new ChemistryInputError(
				`Ions carry a net charge of ${netCharge}; a salt must be neutral`,
				{
					field: `${field}.ions`
				}
			);
		}
	}
	if (particles === 0 && molarMassGPerMol !== null) particles = 1;
	return { ions, particles, ionicStrengthPerMolar };
}

/** Solubility points sorted by temperature, on the component's own basis or another formula's. */
function readSolubility(
	spec: ComponentSpec,
	field: string,
	molarMassGPerMol: number | null
): ResolvedComponent['solubility'] {
	const solubility = spec.solubility!;
	const solubilityField = `${field}.solubility`;
	const points = solubility.points;
	if (!Array.isArray(points) || points.length === 0) {
		throw new ChemistryInputError('Solubility needs at least one point', {
			field: `${solubilityField}.points`
		});
	}
	points.forEach((p, i) => {
		if (
			!p ||
			typeof p.temperatureC !== 'number' ||
			!Number.isFinite(p.temperatureC) ||
			p.temperatureC < -20 ||
			p.temperatureC > 150
		) {
			throw new ChemistryInputError('Solubility temperature must be between -20 and 150 °C', {
				field: `${solubilityField}.points.${i}.temperatureC`
			});
		}
		if (!isPositiveFinite(p.gPerL)) {
			throw new ChemistryInputError('Solubility must be a positive number of g/L', {
				field: `${solubilityField}.points.${i}.gPerL`
			});
		}
	});
	const basisFormula = solubility.basisFormula;
	let basisMolarMassGPerMol: number | null = null;
	if (basisFormula) {
		if (molarMassGPerMol === null) {
			throw new ChemistryInputError(
				'A solubility on another basis needs the component’s formula or molar mass',
				{
					field: `${solubilityField}.basisFormula`
				}
			);
		}
		basisMolarMassGPerMol = vectorOfFormula(
			basisFormula,
			`${solubilityField}.basisFormula`
		).molarMassGPerMol;
	}
	return {
		points: [...points].sort((a, b) => a.temperatureC - b.temperatureC),
		basisMolarMassGPerMol,
		source: solubility.source ?? 'given with the component'
	};
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
			const invT = 1 / (temperatureC + 273.15);
			const invA = 1 / (a.temperatureC + 273.15);
			const invB = 1 / (b.temperatureC + 273.15);
			const fraction = (invT - invA) / (invB - invA);
			const lnS = Math.log(a.gPerL) + fraction * (Math.log(b.gPerL) - Math.log(a.gPerL));
			return { gPerL: Math.exp(lnS), exact: false, withinRange: true };
		}
	}
	return { gPerL: last.gPerL, exact: false, withinRange: false };
}
