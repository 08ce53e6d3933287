// Reading the growth balance's species, balanced elements and specifications: every refusal names its field.
import { REDUCTION_ELEMENTS } from '../degree-of-reduction';
import { ChemistryInputError } from '../errors';
import { readFinite, readNonNegative } from '../input';
import { molarMassOf, parseFormula } from '../formula';
import {
	type SpeciesRole,
	ROLES,
	type StoichiometrySpecies,
	type StoichiometrySpecification,
	DEFAULT_BALANCE_ELEMENTS,
	DEFAULT_RELATIVE_ERROR,
	type Species,
	type Spec,
	CONSUMED,
	PRODUCED
} from './types';

// Order in which undetermined species are suggested: what a lab can actually measure first.
export const HINT_ORDER: readonly (SpeciesRole | undefined)[] = [
	'oxygen',
	'carbonDioxide',
	'product',
	'biomass',
	'substrate',
	'nitrogen',
	'water',
	undefined
];

function isExactly(elements: Record<string, number>, expected: Record<string, number>): boolean {
	const keys = Object.keys(elements).filter((k) => elements[k] !== 0);
	if (keys.length !== Object.keys(expected).length) return false;
	return keys.every(
		(k) => expected[k] !== undefined && Math.abs(elements[k] - expected[k]) < 1e-12
	);
}

function inferRole(elements: Record<string, number>): SpeciesRole | undefined {
	if (isExactly(elements, { O: 2 })) return 'oxygen';
	if (isExactly(elements, { C: 1, O: 2 })) return 'carbonDioxide';
	if (isExactly(elements, { H: 2, O: 1 })) return 'water';
	if (isExactly(elements, { N: 1, H: 3 })) return 'nitrogen';
	return undefined;
}

const parsedFormulas = new Map<string, Readonly<Record<string, number>>>();

// The same few formulas (O2, CO2, H2O, NH3, glucose) recur in every balance, so parse each once.
function parseElements(formula: string): Record<string, number> {
	let elements = parsedFormulas.get(formula);
	if (!elements) {
		elements = Object.freeze(parseFormula(formula).elements);
		if (parsedFormulas.size > 1000) parsedFormulas.clear();
		parsedFormulas.set(formula, elements);
	}
	return { ...elements };
}

export function readSpecies(input: unknown): Species[] {
	if (!Array.isArray(input) || input.length < 2) {
		throw new ChemistryInputError('At least two species are needed for a balance', {
			field: 'species'
		});
	}
	const seen = new Map<string, number>();
	const species: Species[] = [];
	let biomassIndex = -1;
	input.forEach((raw: unknown, index) => {
		const field = `species.${index}`;
		const s = readSpeciesIdentity(raw, field, index, seen);
		const parsed = parseSpeciesFormula(s.formula, s.id, field);
		const given = readSpeciesRole(s, field);
		const ashFraction = given.ashFraction;
		const roleGiven = given.role !== undefined;
		const role = given.role ?? inferRole(parsed);
		let elements = parsed;
		if (role === 'biomass') {
			if (biomassIndex >= 0) {
				throw new ChemistryInputError(
					`Only one biomass species is allowed (species ${biomassIndex} is biomass too)`,
					{
						field: `${field}.role`
					}
				);
			}
			biomassIndex = index;
			const c = parsed.C ?? 0;
			if (c <= 0) {
				throw new ChemistryInputError(`Biomass formula '${s.formula}' must contain carbon`, {
					field: `${field}.formula`
				});
			}
			// Biomass is counted per C-mol, so its formula is normalised to one carbon.
			elements = Object.fromEntries(Object.entries(parsed).map(([k, n]) => [k, n / c]));
		}
		const molarMass = molarMassOf(elements) / (1 - ashFraction);
		species.push({
			id: s.id,
			index,
			formula: s.formula,
			elements,
			role,
			roleGiven,
			ashFraction,
			molarMass,
			carbon: elements.C ?? 0
		});
	});
	return species;
}

/** An object with a unique, non-empty id and a formula given as text. */
function readSpeciesIdentity(
	raw: unknown,
	field: string,
	index: number,
	seen: Map<string, number>
): Partial<StoichiometrySpecies> & { id: string; formula: string } {
	if (raw === null || typeof raw !== 'object') {
		throw new ChemistryInputError('Each species must be an object with id and formula', {
			field
		});
	}
	const s = raw as Partial<StoichiometrySpecies>;
	if (typeof s.id !== 'string' || s.id.trim() === '') {
		throw new ChemistryInputError('Species id must be a non-empty text', {
			field: `${field}.id`
		});
	}
	if (seen.has(s.id)) {
		throw new ChemistryInputError(
			`Species id '${s.id}' is used twice (also species ${seen.get(s.id)})`,
			{
				field: `${field}.id`
			}
		);
	}
	seen.set(s.id, index);
	if (typeof s.formula !== 'string') {
		throw new ChemistryInputError(`Formula of '${s.id}' must be text`, {
			field: `${field}.formula`
		});
	}
	return s as Partial<StoichiometrySpecies> & { id: string; formula: string };
}

function parseSpeciesFormula(formula: string, id: string, field: string): Record<string, number> {
	try {
		return parseElements(formula);
	} catch (e) {
		if (e instanceof ChemistryInputError) {
			throw new ChemistryInputError(`Formula of '${id}': ${e.message}`, {
				field: `${field}.formula`,
				position: e.position
			});
		}
		throw e;
	}
}

/** The role given, and the ash fraction (which makes a species biomass). */
function readSpeciesRole(
	s: Partial<StoichiometrySpecies> & { id: string },
	field: string
): { role: SpeciesRole | undefined; ashFraction: number } {
	if (s.role !== undefined && !ROLES.includes(s.role)) {
		throw new ChemistryInputError(
			`Unknown role '${String(s.role)}'; use one of ${ROLES.join(', ')}`,
			{
				field: `${field}.role`
			}
		);
	}
	const role: SpeciesRole | undefined = s.role;
	if (s.ashFraction === undefined) return { role, ashFraction: 0 };
	if (
		typeof s.ashFraction !== 'number' ||
		!Number.isFinite(s.ashFraction) ||
		s.ashFraction < 0 ||
		s.ashFraction >= 1
	) {
		throw new ChemistryInputError(
			`Ash fraction of '${s.id}' must be a number from 0 up to (not including) 1`,
			{
				field: `${field}.ashFraction`
			}
		);
	}
	if (role !== undefined && role !== 'biomass') {
		throw new ChemistryInputError(
			`Ash fraction applies to biomass only, but '${s.id}' has role ${role}`,
			{
				field: `${field}.ashFraction`
			}
		);
	}
	return { role: 'biomass', ashFraction: s.ashFraction };
}

export function readElements(input: unknown, species: Species[]): string[] {
	const elements = input === undefined ? [...DEFAULT_BALANCE_ELEMENTS] : input;
	if (!Array.isArray(elements) || elements.length === 0) {
		throw new ChemistryInputError(
			'Elements must be a non-empty list such as ["C", "H", "O", "N"]',
			{
				field: 'elements'
			}
		);
	}
	const seen = new Set<string>();
	elements.forEach((el: unknown, i) => {
		if (typeof el !== 'string' || !REDUCTION_ELEMENTS.includes(el)) {
			throw new ChemistryInputError(
				`Element '${String(el)}' cannot be balanced here: use C, H, O, N, P or S (the degree-of-reduction convention defines only these)`,
				{ field: `elements.${i}` }
			);
		}
		if (seen.has(el))
			throw new ChemistryInputError(`Element ${el} is listed twice`, { field: `elements.${i}` });
		seen.add(el);
		const carriers = species.filter((s) => (s.elements[el] ?? 0) > 0);
		if (carriers.length === 0) {
			throw new ChemistryInputError(
				`No species contains ${el}; leave it out of the balanced elements`,
				{
					field: `elements.${i}`
				}
			);
		}
		if (carriers.length === 1) {
			throw new ChemistryInputError(
				`Only '${carriers[0].id}' contains ${el}, so the ${el} balance would force its rate to 0: add a species that supplies ${el} or leave ${el} out`,
				{ field: `elements.${i}` }
			);
		}
	});
	species.forEach((s) => {
		if (!elements.some((el: string) => (s.elements[el] ?? 0) > 0)) {
			throw new ChemistryInputError(
				`Formula of '${s.id}' contains none of the balanced elements (${elements.join(', ')})`,
				{
					field: `species.${s.index}.formula`
				}
			);
		}
	});
	return elements as string[];
}

export function readSpecifications(input: unknown, byId: Map<string, Species>): Spec[] {
	if (!Array.isArray(input)) {
		throw new ChemistryInputError('Specifications must be a list', { field: 'specifications' });
	}
	const ref = (value: unknown, field: string): Species => {
		const s = typeof value === 'string' ? byId.get(value) : undefined;
		if (!s)
			throw new ChemistryInputError(`Species '${String(value)}' is not in the species list`, {
				field
			});
		return s;
	};
	const rateSpecs = new Map<number, { index: number; mol: number }>();
	return input.map((raw: unknown, index): Spec => {
		const field = `specifications.${index}`;
		if (raw === null || typeof raw !== 'object') {
			throw new ChemistryInputError('Each specification must be an object with a kind', { field });
		}
		const spec = raw as StoichiometrySpecification;
		const relativeError = spec.relativeError ?? DEFAULT_RELATIVE_ERROR;
		if (
			typeof relativeError !== 'number' ||
			!Number.isFinite(relativeError) ||
			relativeError <= 0
		) {
			throw new ChemistryInputError('Relative error must be a number greater than 0', {
				field: `${field}.relativeError`
			});
		}
		if (spec.kind === 'rate') {
			const s = ref(spec.species, `${field}.species`);
			const mol = readRate(spec.mol, s, field, index, rateSpecs);
			return { index, kind: 'rate', a: s.index, b: -1, value: mol, relativeError };
		}
		if (spec.kind === 'massYield') {
			const p = ref(spec.product, `${field}.product`);
			const s = ref(spec.substrate, `${field}.substrate`);
			if (p === s) {
				throw new ChemistryInputError('A yield needs two different species', {
					field: `${field}.substrate`
				});
			}
			const gPerG = readNonNegative(spec.gPerG, `${field}.gPerG`, 'Yield');
			return { index, kind: 'massYield', a: p.index, b: s.index, value: gPerG, relativeError };
		}
		if (spec.kind === 'molarRatio') {
			const n = ref(spec.numerator, `${field}.numerator`);
			const d = ref(spec.denominator, `${field}.denominator`);
			if (n === d) {
				throw new ChemistryInputError('A ratio needs two different species', {
					field: `${field}.denominator`
				});
			}
			const value = readNonNegative(spec.value, `${field}.value`, 'Ratio');
			return { index, kind: 'molarRatio', a: n.index, b: d.index, value, relativeError };
		}
		throw new ChemistryInputError(
			`Unknown specification kind '${String((spec as { kind?: unknown }).kind)}'; use 'rate', 'massYield' or 'molarRatio'`,
			{ field: `${field}.kind` }
		);
	});
}

/** A rate: its sign must match the species' direction, and a species' rate is fixed once. */
function readRate(
	value: unknown,
	s: Species,
	field: string,
	index: number,
	rateSpecs: Map<number, { index: number; mol: number }>
): number {
	const mol = readFinite(value, `${field}.mol`, 'Rate');
	if (s.role && mol !== 0) {
		const how = s.roleGiven ? `role ${s.role}` : `taken as ${s.role} from its formula`;
		if (CONSUMED.has(s.role) && mol > 0) {
			throw new ChemistryInputError(
				`'${s.id}' is consumed (${how}), so its rate must be negative: consumed negative, produced positive. If it is produced here, give it role 'product'`,
				{ field: `${field}.mol` }
			);
		}
		if (PRODUCED.has(s.role) && mol < 0) {
			throw new ChemistryInputError(
				`'${s.id}' is produced (${how}), so its rate must be positive: consumed negative, produced positive. If it is consumed here, give it role 'substrate'`,
				{ field: `${field}.mol` }
			);
		}
	}
	const earlier = rateSpecs.get(s.index);
	if (earlier && earlier.mol !== mol) {
		throw new ChemistryInputError(
			`Specifications ${earlier.index} and ${index} fix the rate of '${s.id}' to different values (${earlier.mol} and ${mol})`,
			{ field: `${field}.mol` }
		);
	}
	rateSpecs.set(s.index, { index, mol });
	return mol;
}
