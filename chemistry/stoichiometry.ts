/**
 * Black-box growth stoichiometry by element balances (Roels 1983; Heijnen, in Smolke (ed.) The
 * Metabolic Pathway Engineering Handbook — citations from memory).
 *
 * Each species j has a rate r_j (mol; C-mol for biomass; consumed negative, produced positive). The
 * balanced elements give E·r = 0 (E: atoms per unit, elements × species). Each specification adds one
 * linear row s·r = b: a rate fixes r_j; a mass yield |r_p|·M_p = Y·|r_s|·M_s and a molar ratio
 * |r_n| = v·|r_d| become linear once each species' direction is known (from its role, otherwise found
 * by re-solving). The combined system [E; S]·r = [0; b] is solved by writing r = N·z with N an
 * orthonormal null-space basis of E (SVD), so the element balances hold exactly and only S·N·z = b is
 * solved — exactly when determined, by weighted least squares when specifications are redundant.
 *
 * Degrees of freedom = #species − rank(E); redundancy = #specifications − (their independent count).
 * With redundancy, consistency is judged by h = Σ (δ_i/σ_i)², δ_i the relative deviation of
 * specification i from its given value at the least-squares solution and σ_i its relative standard
 * error, against the χ² quantile with `redundancy` degrees of freedom (the test of Wang &
 * Stephanopoulos 1983, Biotechnol. Bioeng. 25:2177, and van der Heijden et al. 1994, Biotechnol.
 * Bioeng. 43:3 — citations from memory).
 */
import { Matrix, QrDecomposition, SingularValueDecomposition } from 'ml-matrix';
import { computeDegreeOfReduction, REDUCTION_ELEMENTS } from './degree-of-reduction';
import { ChemistryInputError } from './errors';
import { readFinite, readNonNegative } from './input';
import { molarMassOf, parseFormula } from './formula';
import { computeChiSquareCdf, computeChiSquareQuantile } from './statistics';

export type SpeciesRole =
	'substrate' | 'nitrogen' | 'oxygen' | 'biomass' | 'carbonDioxide' | 'water' | 'product';

const ROLES: readonly SpeciesRole[] = [
	'substrate',
	'nitrogen',
	'oxygen',
	'biomass',
	'carbonDioxide',
	'water',
	'product'
];

export interface StoichiometrySpecies {
	id: string;
	formula: string;
	/** Ash mass fraction of dry biomass (0 ≤ a < 1); marks the species as biomass. */
	ashFraction?: number;
	role?: SpeciesRole;
}

/** `relativeError` is the relative standard error used in the consistency test; default 0.05. */
export type StoichiometrySpecification =
	| { kind: 'rate'; species: string; mol: number; relativeError?: number }
	| { kind: 'massYield'; product: string; substrate: string; gPerG: number; relativeError?: number }
	| {
			kind: 'molarRatio';
			numerator: string;
			denominator: string;
			value: number;
			relativeError?: number;
	  };

export interface StoichiometryInput {
	species: StoichiometrySpecies[];
	/** Elements to balance, from C, H, O, N, P, S; default C, H, O, N. */
	elements?: string[];
	specifications: StoichiometrySpecification[];
	/** Confidence level of the consistency test; default 0.95. */
	consistencyConfidence?: number;
}

export interface SpeciesRate {
	/** mol, or C-mol for biomass. */
	mol: number;
	/** g; for biomass dry weight including ash. */
	g: number;
	/** C-mol for carbon species, null otherwise. */
	cmol: number | null;
}

export interface StoichiometryYields {
	/** The first substrate (in species order) that is consumed, or null. */
	firstSubstrate: string | null;
	/** Yx/s in g/g on the first substrate. */
	biomassOnSubstrateGPerG: number | null;
	biomassOnSubstrateCmolPerCmol: number | null;
	/** Per consumed substrate: Yx/s and every product's yield, g/g. */
	perSubstrate: Record<
		string,
		{
			biomassGPerG: number | null;
			biomassCmolPerCmol: number | null;
			productsGPerG: Record<string, number>;
		}
	>;
	/** Yx/O2, g dry biomass per g O2. */
	biomassOnOxygenGPerG: number | null;
	/** g O2 per g dry biomass (1/Yx/O2). */
	oxygenPerBiomassGPerG: number | null;
	/** RQ: mol CO2 produced per mol O2 consumed. */
	respiratoryQuotient: number | null;
}

export interface ElectronBalance {
	/** γ (per unit) × r for each species, mol electrons; Σ is 0 when the balance closes. */
	terms: Record<string, number>;
	sum: number;
	/** |Σ γr| / Σ |γr|. */
	relativeResidual: number;
	closes: boolean;
	/** Electrons available in the consumed substrates, Σ γ|r|, mol. */
	availableFromSubstratesMol: number;
	/** Share of the substrate electrons ending in each other species (biomass η, O2 ε, products). */
	fractions: Record<string, number>;
}

export interface SpecificationDeviation {
	index: number;
	kind: StoichiometrySpecification['kind'];
	given: number;
	fitted: number;
	/** (fitted − given)/given; absolute (relative to the largest rate) when given is 0. */
	relativeDeviation: number;
	relativeError: number;
}

export interface StoichiometryConsistency {
	redundancy: number;
	/** h = Σ (δ/σ)². */
	chiSquare: number;
	threshold: number;
	confidence: number;
	pValue: number;
	consistent: boolean;
	deviations: SpecificationDeviation[];
}

export interface StoichiometryResult {
	elements: string[];
	rates: Record<string, SpeciesRate>;
	/** Role as given, inferred from the formula, or from the solved direction (null: zero rate). */
	roles: Record<string, SpeciesRole | null>;
	/** g/mol; for biomass g per C-mol of dry weight (ash included). */
	molarMasses: Record<string, number>;
	yields: StoichiometryYields;
	/** Per C-mol for carbon species, per mole otherwise (C +4, H +1, O −2, N −3, P +5, S +6). */
	degreesOfReduction: Record<string, number>;
	electronBalance: ElectronBalance;
	/** E·r per element, mol. */
	elementResiduals: Record<string, number>;
	degreesOfFreedom: number;
	redundancy: number;
	independentSpecifications: number;
	consistency?: StoichiometryConsistency;
	notes: string[];
}

export const DEFAULT_BALANCE_ELEMENTS = ['C', 'H', 'O', 'N'] as const;
/** Relative standard error of a specification when none is given (common practice: 2–5 %). */
export const DEFAULT_RELATIVE_ERROR = 0.05;

interface Species {
	id: string;
	index: number;
	formula: string;
	/** Atoms per unit: per C-mol for biomass. */
	elements: Record<string, number>;
	role: SpeciesRole | undefined;
	roleGiven: boolean;
	ashFraction: number;
	molarMass: number;
	carbon: number;
}

interface Spec {
	index: number;
	kind: StoichiometrySpecification['kind'];
	a: number;
	b: number;
	value: number;
	relativeError: number;
}

const CONSUMED: ReadonlySet<SpeciesRole> = new Set(['substrate', 'nitrogen', 'oxygen']);
const PRODUCED: ReadonlySet<SpeciesRole> = new Set(['biomass', 'carbonDioxide', 'product']);
// Order in which undetermined species are suggested: what a lab can actually measure first.
const HINT_ORDER: readonly (SpeciesRole | undefined)[] = [
	'oxygen',
	'carbonDioxide',
	'product',
	'biomass',
	'substrate',
	'nitrogen',
	'water',
	undefined
];
const RANK_TOLERANCE = 1e-10;

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

function readSpecies(input: unknown): Species[] {
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
		let parsed: Record<string, number>;
		try {
			parsed = parseElements(s.formula);
		} catch (e) {
			if (e instanceof ChemistryInputError) {
				throw new ChemistryInputError(`Formula of '${s.id}': ${e.message}`, {
					field: `${field}.formula`,
					position: e.position
				});
			}
			throw e;
		}
		if (s.role !== undefined && !ROLES.includes(s.role)) {
			throw new ChemistryInputError(
				`Unknown role '${String(s.role)}'; use one of ${ROLES.join(', ')}`,
				{
					field: `${field}.role`
				}
			);
		}
		let role: SpeciesRole | undefined = s.role;
		let ashFraction = 0;
		if (s.ashFraction !== undefined) {
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
			ashFraction = s.ashFraction;
			role = 'biomass';
		}
		const roleGiven = role !== undefined;
		role ??= inferRole(parsed);
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

function readElements(input: unknown, species: Species[]): string[] {
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

function readSpecifications(input: unknown, byId: Map<string, Species>): Spec[] {
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
			const mol = readFinite(spec.mol, `${field}.mol`, 'Rate');
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

interface Decomposition {
	rank: number;
	singularValues: number[];
	/** Right singular vectors as columns, full (cols × cols). */
	v: Matrix;
}

function decompose(rows: number[][], cols: number): Decomposition {
	// Pad to at least square so the SVD returns the full right basis, null space included.
	const padded = rows.map((r) => [...r]);
	while (padded.length < cols) padded.push(new Array(cols).fill(0));
	const svd = new SingularValueDecomposition(new Matrix(padded), {
		computeLeftSingularVectors: false
	});
	const singularValues = svd.diagonal;
	const max = singularValues[0] ?? 0;
	const rank = max === 0 ? 0 : singularValues.filter((s) => s > max * RANK_TOLERANCE).length;
	return { rank, singularValues, v: svd.rightSingularVectors };
}

function columns(m: Matrix, from: number, to: number): Matrix {
	return to > from ? m.subMatrix(0, m.rows - 1, from, to - 1) : new Matrix(m.rows, 0);
}

function label(s: Species): string {
	return s.id === s.formula ? s.id : `${s.id} (${s.formula})`;
}

function joinOr(items: string[], word: string): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} ${word} ${items[items.length - 1]}`;
}

interface Rows {
	coefficients: number[][];
	rhs: number[];
}

function buildRows(specs: Spec[], signs: number[], molarMasses: number[], n: number): Rows {
	const coefficients: number[][] = [];
	const rhs: number[] = [];
	for (const spec of specs) {
		const row = new Array(n).fill(0);
		if (spec.kind === 'rate') {
			row[spec.a] = 1;
			rhs.push(spec.value);
		} else if (spec.kind === 'massYield') {
			// |r_p|·M_p − Y·|r_s|·M_s = 0 with |r| = sign·r
			row[spec.a] += signs[spec.a] * molarMasses[spec.a];
			row[spec.b] -= spec.value * signs[spec.b] * molarMasses[spec.b];
			rhs.push(0);
		} else {
			row[spec.a] += signs[spec.a];
			row[spec.b] -= spec.value * signs[spec.b];
			rhs.push(0);
		}
		coefficients.push(row);
	}
	return { coefficients, rhs };
}

/** Residual scale of each row so that residual/scale is the relative deviation of the spec. */
function rowScales(specs: Spec[], rates: number[], molarMasses: number[]): number[] {
	const maxRate = Math.max(...rates.map(Math.abs), Number.MIN_VALUE);
	return specs.map((spec) => {
		if (spec.kind === 'rate') return spec.value !== 0 ? Math.abs(spec.value) : maxRate;
		const denominator = Math.max(Math.abs(rates[spec.b]), maxRate * 1e-9);
		const base = spec.kind === 'massYield' ? denominator * molarMasses[spec.b] : denominator;
		return spec.value !== 0 ? spec.value * base : base;
	});
}

function multiply(a: number[][], b: Matrix): Matrix {
	return new Matrix(a).mmul(b);
}

function solveLeastSquares(matrix: Matrix, rhs: number[], weights: number[]): Matrix {
	const w = Matrix.diag(weights);
	const a = w.mmul(matrix);
	const y = w.mmul(Matrix.columnVector(rhs));
	return new QrDecomposition(a).solve(y);
}

interface Solved {
	rates: number[];
	rankM: number;
}

function solveReduced(
	rows: Rows,
	specs: Spec[],
	nullBasis: Matrix,
	species: Species[],
	molarMasses: number[]
): Solved {
	const d = nullBasis.columns;
	if (specs.length === 0) {
		throw new ChemistryInputError(
			`${d} specification${d === 1 ? ' is' : 's are'} needed (the degrees of freedom of this balance), at least one of them a non-zero rate to set the scale, e.g. the substrate consumed and a yield or a ratio that involves ${joinOr(
				[...species]
					.sort((a, b) => HINT_ORDER.indexOf(a.role) - HINT_ORDER.indexOf(b.role))
					.slice(0, 2)
					.map((s) => s.id),
				'or'
			)}`,
			{ field: 'specifications' }
		);
	}
	const norms = rows.coefficients.map((r) => Math.hypot(...r));
	const normalised = rows.coefficients.map((r, i) => r.map((c) => c / norms[i]));
	const reduced = multiply(normalised, nullBasis);
	const dec = decompose(reduced.to2DArray(), d);
	const rankM = dec.rank;
	if (rankM < d) throwUnderSpecified(d - rankM, columns(dec.v, rankM, d), nullBasis, species, rows);
	if (rows.rhs.every((b) => b === 0)) {
		const first = species.find((s) => s.role === 'substrate') ?? species[0];
		throw new ChemistryInputError(
			`1 more specification is needed: a non-zero rate to set the scale, e.g. { kind: 'rate', species: '${first.id}', mol: -1 }. The yields, ratios and zero rates given fix only proportions, so without it every rate comes out 0`,
			{ field: 'specifications' }
		);
	}
	const bNormalised = rows.rhs.map((b, i) => b / norms[i]);
	const solveRates = (weights: number[]): number[] => {
		const z = solveLeastSquares(reduced, bNormalised, weights);
		return nullBasis.mmul(z).getColumn(0);
	};
	let rates = solveRates(new Array(specs.length).fill(1));
	const redundancy = specs.length - rankM;
	if (redundancy > 0) {
		// Reweight so each row's residual is its relative deviation over its relative error; the
		// scales depend on the solution, so iterate (a few passes settle it).
		for (let pass = 0; pass < 30; pass++) {
			const scales = rowScales(specs, rates, molarMasses);
			const weights = specs.map((s, i) => norms[i] / (scales[i] * s.relativeError));
			const next = solveRates(weights);
			const change = Math.max(...next.map((r, j) => Math.abs(r - rates[j])));
			const size = Math.max(...next.map(Math.abs));
			rates = next;
			if (change <= 1e-14 * size) break;
		}
	}
	return { rates, rankM };
}

function throwUnderSpecified(
	missing: number,
	reducedNull: Matrix,
	nullBasis: Matrix,
	species: Species[],
	rows: Rows
): never {
	const directions = nullBasis.mmul(reducedNull);
	const scaleOnly = rows.rhs.every((b) => b === 0);
	const undetermined = species.filter((s) => {
		const row = directions.getRow(s.index);
		return Math.max(...row.map(Math.abs)) > 1e-9;
	});
	const plural = missing === 1 ? 'specification is' : 'specifications are';
	if (scaleOnly && missing === 1 && rows.coefficients.length > 0) {
		const first = species.find((s) => s.role === 'substrate') ?? undetermined[0] ?? species[0];
		throw new ChemistryInputError(
			`1 more specification is needed: the specifications fix only yields and ratios, so the scale is open. Add a rate, e.g. { kind: 'rate', species: '${first.id}', mol: -1 }`,
			{ field: 'specifications' }
		);
	}
	const ranked = [...undetermined].sort(
		(a, b) => HINT_ORDER.indexOf(a.role) - HINT_ORDER.indexOf(b.role)
	);
	const suggestions = ranked.slice(0, 2).map((s) => s.id);
	const scaleNote = scaleOnly
		? ' None of them sets the scale, so at least one must be a non-zero rate.'
		: '';
	throw new ChemistryInputError(
		`${missing} more ${plural} needed: the rates of ${joinOr(undetermined.map(label), 'and')} are not yet fixed by the element balances and the specifications given. Add, for example, a rate, a yield or a ratio that involves ${joinOr(suggestions, 'or')}.${scaleNote}`,
		{ field: 'specifications' }
	);
}

function expectedSign(s: Species): number {
	if (s.role && CONSUMED.has(s.role)) return -1;
	return 1;
}

function isFixedDirection(s: Species): boolean {
	return s.role !== undefined && (CONSUMED.has(s.role) || PRODUCED.has(s.role));
}

/**
 * Solves the growth stoichiometry. Rates: consumed negative, produced positive; biomass per C-mol.
 * Throws ChemistryInputError when under-specified (saying how many more and on which species),
 * when a species' solved direction contradicts its role, or on malformed input.
 */
export function solveStoichiometry(input: StoichiometryInput): StoichiometryResult {
	if (input === null || typeof input !== 'object') {
		throw new ChemistryInputError(
			'Stoichiometry input must be an object with species and specifications'
		);
	}
	const species = readSpecies(input.species);
	const n = species.length;
	const elements = readElements(input.elements, species);
	const byId = new Map(species.map((s) => [s.id, s]));
	const specs = readSpecifications(input.specifications, byId);
	const confidence = input.consistencyConfidence ?? 0.95;
	if (typeof confidence !== 'number' || !(confidence > 0 && confidence < 1)) {
		throw new ChemistryInputError('Consistency confidence must be between 0 and 1, e.g. 0.95', {
			field: 'consistencyConfidence'
		});
	}
	const molarMasses = species.map((s) => s.molarMass);

	const elementMatrix = elements.map((el) => species.map((s) => s.elements[el] ?? 0));
	const eDec = decompose(elementMatrix, n);
	const degreesOfFreedom = n - eDec.rank;
	if (degreesOfFreedom === 0) {
		throw new ChemistryInputError(
			`The element balances alone force every rate to 0 (${n} species, ${eDec.rank} independent balances): add the species that close the balance, e.g. CO2 or H2O`,
			{ field: 'species' }
		);
	}
	const nullBasis = columns(eDec.v, eDec.rank, n);

	// Directions: fixed by role where it has one; otherwise guessed and corrected by re-solving.
	const signs = species.map(expectedSign);
	for (const spec of specs) {
		if (spec.kind === 'rate' && spec.value !== 0 && !isFixedDirection(species[spec.a])) {
			signs[spec.a] = Math.sign(spec.value);
		}
	}
	const tried = new Set<string>();
	let solved: Solved | undefined;
	for (let attempt = 0; attempt < 2 * n + 2; attempt++) {
		tried.add(signs.join(','));
		solved = solveReduced(
			buildRows(specs, signs, molarMasses, n),
			specs,
			nullBasis,
			species,
			molarMasses
		);
		const maxRate = Math.max(...solved.rates.map(Math.abs));
		const flips = new Set<number>();
		for (const spec of specs) {
			if (spec.kind === 'rate') continue;
			for (const j of [spec.a, spec.b]) {
				if (!isFixedDirection(species[j]) && signs[j] * solved.rates[j] < -1e-9 * maxRate)
					flips.add(j);
			}
		}
		if (flips.size === 0) break;
		for (const j of flips) signs[j] = -signs[j];
		if (tried.has(signs.join(','))) {
			throw new ChemistryInputError(
				`No consistent direction found for ${joinOr(
					[...flips].map((j) => `'${species[j].id}'`),
					'and'
				)}: the yields and ratios given cannot all hold. Give the species a role or check the values`,
				{ field: 'specifications' }
			);
		}
		solved = undefined;
	}
	if (!solved) {
		throw new ChemistryInputError(
			'The yields and ratios given cannot all hold with consistent directions',
			{
				field: 'specifications'
			}
		);
	}
	const rates = solved.rates;
	const maxRate = Math.max(...rates.map(Math.abs));
	for (const s of species) {
		if (!isFixedDirection(s) || !s.role) continue;
		const r = rates[s.index];
		const wrong = CONSUMED.has(s.role) ? r > 1e-9 * maxRate : r < -1e-9 * maxRate;
		if (wrong) {
			const came = r > 0 ? 'produced' : 'consumed';
			const should = CONSUMED.has(s.role) ? 'consumed' : 'produced';
			const hint =
				s.role === 'oxygen'
					? ' (a biomass or product yield above what the substrate electrons allow makes O2 come out produced)'
					: '';
			throw new ChemistryInputError(
				`With these specifications '${s.id}' comes out ${came} (${formatNumber(r)} mol), but as ${s.role} it must be ${should}${hint}. Check the values, or give '${s.id}' the role that matches`,
				{ field: 'specifications' }
			);
		}
	}

	// Results.
	const notes: string[] = [];
	for (const s of species) {
		const unbalanced = Object.keys(s.elements).filter((el) => !elements.includes(el));
		if (unbalanced.length > 0) {
			notes.push(
				`'${s.id}' contains ${unbalanced.join(', ')}, which ${unbalanced.length === 1 ? 'is' : 'are'} not balanced`
			);
		}
	}
	const ratesOut: Record<string, SpeciesRate> = {};
	const molarMassesOut: Record<string, number> = {};
	const roles: Record<string, SpeciesRole | null> = {};
	for (const s of species) {
		const r = rates[s.index];
		ratesOut[s.id] = { mol: r, g: r * s.molarMass, cmol: s.carbon > 0 ? r * s.carbon : null };
		molarMassesOut[s.id] = s.molarMass;
		roles[s.id] = s.role ?? resolveRole(s, r, maxRate);
	}

	const balanced = Object.fromEntries(elements.map((el) => [el, 1]));
	const degreesOfReduction: Record<string, number> = {};
	const terms: Record<string, number> = {};
	const gammaPerUnit: number[] = [];
	for (const s of species) {
		// γ over the balanced elements only, so Σ γ·r follows from the element balances.
		const counted = Object.fromEntries(Object.entries(s.elements).filter(([el]) => el in balanced));
		const dor = computeDegreeOfReduction(counted, { field: `species.${s.index}.formula` });
		degreesOfReduction[s.id] = dor.value;
		gammaPerUnit.push(dor.perMol);
		terms[s.id] = dor.perMol * rates[s.index];
	}
	const termValues = Object.values(terms);
	const sum = termValues.reduce((acc, t) => acc + t, 0);
	const total = termValues.reduce((acc, t) => acc + Math.abs(t), 0);
	const substrates = species.filter((s) => roles[s.id] === 'substrate' && rates[s.index] < 0);
	const available = substrates.reduce((acc, s) => acc - gammaPerUnit[s.index] * rates[s.index], 0);
	const fractions: Record<string, number> = {};
	if (available > 0) {
		for (const s of species) {
			if (substrates.includes(s) || terms[s.id] === 0) continue;
			fractions[s.id] = terms[s.id] / available;
		}
	}
	const relativeResidual = total > 0 ? Math.abs(sum) / total : 0;

	const elementResiduals: Record<string, number> = {};
	elements.forEach((el, i) => {
		elementResiduals[el] = elementMatrix[i].reduce((acc, c, j) => acc + c * rates[j], 0);
	});

	const redundancy = specs.length - solved.rankM;
	const result: StoichiometryResult = {
		elements,
		rates: ratesOut,
		roles,
		molarMasses: molarMassesOut,
		yields: computeYields(species, rates, roles),
		degreesOfReduction,
		electronBalance: {
			terms,
			sum,
			relativeResidual,
			closes: relativeResidual < 1e-9,
			availableFromSubstratesMol: available,
			fractions
		},
		elementResiduals,
		degreesOfFreedom,
		redundancy,
		independentSpecifications: solved.rankM,
		notes
	};
	if (redundancy > 0)
		result.consistency = assessConsistency(specs, rates, molarMasses, redundancy, confidence);
	return result;
}

function formatNumber(value: number): string {
	return Number(value.toPrecision(4)).toString();
}

function resolveRole(s: Species, rate: number, maxRate: number): SpeciesRole | null {
	if (Math.abs(rate) <= 1e-12 * maxRate) return null;
	if (rate < 0)
		return s.carbon > 0 ? 'substrate' : (s.elements.N ?? 0) > 0 ? 'nitrogen' : 'substrate';
	return 'product';
}

function computeYields(
	species: Species[],
	rates: number[],
	roles: Record<string, SpeciesRole | null>
): StoichiometryYields {
	const biomass = species.find((s) => roles[s.id] === 'biomass');
	const oxygen = species.find((s) => roles[s.id] === 'oxygen');
	const co2 = species.find((s) => roles[s.id] === 'carbonDioxide');
	const substrates = species.filter((s) => roles[s.id] === 'substrate' && rates[s.index] < 0);
	const products = species.filter((s) => roles[s.id] === 'product' && rates[s.index] > 0);
	const grams = (s: Species) => Math.abs(rates[s.index]) * s.molarMass;
	const biomassG = biomass ? rates[biomass.index] * biomass.molarMass : null;
	const biomassCmol = biomass ? rates[biomass.index] : null;
	const perSubstrate: StoichiometryYields['perSubstrate'] = {};
	for (const s of substrates) {
		perSubstrate[s.id] = {
			biomassGPerG: biomassG === null ? null : biomassG / grams(s),
			biomassCmolPerCmol:
				biomassCmol === null || s.carbon === 0
					? null
					: biomassCmol / (Math.abs(rates[s.index]) * s.carbon),
			productsGPerG: Object.fromEntries(products.map((p) => [p.id, grams(p) / grams(s)]))
		};
	}
	const first = substrates[0];
	const oxygenConsumedG = oxygen && rates[oxygen.index] < 0 ? grams(oxygen) : 0;
	return {
		firstSubstrate: first ? first.id : null,
		biomassOnSubstrateGPerG: first ? perSubstrate[first.id].biomassGPerG : null,
		biomassOnSubstrateCmolPerCmol: first ? perSubstrate[first.id].biomassCmolPerCmol : null,
		perSubstrate,
		biomassOnOxygenGPerG:
			biomassG !== null && oxygenConsumedG > 0 ? biomassG / oxygenConsumedG : null,
		oxygenPerBiomassGPerG:
			biomassG !== null && biomassG > 0 && oxygen ? oxygenConsumedG / biomassG : null,
		respiratoryQuotient:
			co2 && oxygen && rates[oxygen.index] < 0 ? rates[co2.index] / -rates[oxygen.index] : null
	};
}

function assessConsistency(
	specs: Spec[],
	rates: number[],
	molarMasses: number[],
	redundancy: number,
	confidence: number
): StoichiometryConsistency {
	const maxRate = Math.max(...rates.map(Math.abs));
	const deviations = specs.map((spec): SpecificationDeviation => {
		let fitted: number;
		if (spec.kind === 'rate') fitted = rates[spec.a];
		else {
			const denominator = Math.abs(rates[spec.b]);
			const mass = spec.kind === 'massYield' ? molarMasses[spec.a] / molarMasses[spec.b] : 1;
			fitted = denominator > 0 ? (mass * Math.abs(rates[spec.a])) / denominator : Infinity;
		}
		const scale = spec.value !== 0 ? Math.abs(spec.value) : spec.kind === 'rate' ? maxRate : 1;
		return {
			index: spec.index,
			kind: spec.kind,
			given: spec.value,
			fitted,
			relativeDeviation: (fitted - spec.value) / scale,
			relativeError: spec.relativeError
		};
	});
	const chiSquare = deviations.reduce(
		(acc, d) => acc + (d.relativeDeviation / d.relativeError) ** 2,
		0
	);
	const threshold = computeChiSquareQuantile(confidence, redundancy);
	return {
		redundancy,
		chiSquare,
		threshold,
		confidence,
		pValue: 1 - computeChiSquareCdf(chiSquare, redundancy),
		consistent: chiSquare <= threshold,
		deviations
	};
}
