// Resolving a component spec once (cached per object): its elements per gram, ions, osmotic coefficient and solubility, every refusal naming its field.
import { ChemistryInputError } from './errors';
import { readMolarMass } from './input';
import { ATOMIC_WEIGHTS } from './data/atomic-weights';
import { molarMassOf, parseFormula } from './formula';
import { type IonSpec, type ComponentSpec, type ResolvedComponent } from './components';

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
