/**
 * Nutrient sufficiency: can a medium (plus feeds) support a target biomass?
 *
 * For every requirement line (an element or a component) demand = target biomass × requirement per
 * g of dry biomass (or target cells × per-cell consumption); supply is what the sources deliver per
 * litre of final volume. ratio = supply / demand; the line is sufficient when ratio ≥ safety factor,
 * and the biomass it could support is target × ratio / safety factor — the minimum over lines is the
 * maximum supportable biomass and names the limiting nutrient (Liebig's law of the minimum, as used
 * for medium design, e.g. Stanbury, Whitaker & Hall, Principles of Fermentation Technology — citation
 * from memory). The default safety factor 1.2 is common practice.
 *
 * Carbon is special: most substrate carbon is respired to CO2, not built into cells. With a yield on
 * the carbon source the carbon line becomes demand = X / Yx/s (on that component, or on element C),
 * which includes the respired carbon; without one, the element-C line counts only carbon in biomass
 * (X · f_C), a lower bound, and says so.
 *
 * H and O are left out by default: cells take them from water and O2, not from the dissolved medium.
 *
 * Not every element of a measured cell composition is a requirement. Each line has a role
 * (data/element-roles.ts, common practice, or the profile's own): only 'required' lines (C, N, P,
 * S, K, Mg, the carbon source, further substrates and component demands) name the limit and the
 * maximum supportable biomass; a 'trace' line (Fe, Ca, Zn, Na, Cl ...) that runs short is a warning
 * naming the element. Each line also says how sure its composition value is, and where it comes from.
 */
import { ATOMIC_WEIGHTS } from './data/atomic-weights';
import { findBiomassComposition, BIOMASS_COMPOSITIONS } from './data/biomass';
import { DEFAULT_ELEMENT_ROLES_BASIS, defaultElementRole, type ElementRole } from './data/element-roles';
import { ChemistryInputError } from './errors';
import { formulaMolarMass } from './formula';
import {
	VALUE_CONFIDENCES,
	VALUE_CONFIDENCE_WORDS,
	compareFractionsWithFormula,
	formatPercentOfDryMass,
	readElementStatements,
	statementsOfComposition,
	type ElementStatement,
	type ValueConfidence
} from './profile-elements';

export type SupplyBasis = 'element' | 'component';

/** Amount of one nutrient consumed per cell formed (over the run, not per hour). */
export interface PerCellConsumption {
	key: string;
	basis: SupplyBasis;
	pgPerCell?: number;
	/** mmol per 10^9 cells; needs a molar mass (an element's own, or molarMassGPerMol / formula). */
	mmolPer1e9Cells?: number;
	molarMassGPerMol?: number;
	formula?: string;
}

/** Per element: a role that overrides the default, and how sure the value is (see profile-elements.ts). */
export type ElementStatements = Record<string, ElementStatement>;

export type OrganismProfile =
	| { kind: 'preset'; id: string; elements?: ElementStatements }
	| {
			kind: 'elementalFractions';
			name?: string;
			fractions: Record<string, number>;
			cellDryMassPg?: number;
			elements?: ElementStatements;
			/** Ash-free biomass formula per C-mol: when given, the fractions are checked against it. */
			formula?: string;
			/** g ash per g dry biomass, for the check against the formula. */
			ashFraction?: number;
	  }
	| {
			kind: 'componentRequirements';
			name?: string;
			/** g component per g dry biomass. */
			requirementsGPerG: Record<string, number>;
			cellDryMassPg?: number;
	  }
	| {
			kind: 'perCell';
			name?: string;
			consumption: PerCellConsumption[];
			cellDryMassPg?: number;
			elements?: ElementStatements;
	  };

export type SufficiencyTarget =
	{ biomassGPerL: number } | { cellsPerMl: number; cellDryMassPg?: number };

/**
 * One source of nutrients (the basal medium, a feed, a bolus). `...GPerL` maps are concentrations in
 * this source when `volumeL` is given, otherwise already per litre of final volume (g/L-equivalent).
 * `...G` maps are total grams delivered.
 */
export interface SupplySource {
	name?: string;
	volumeL?: number;
	elementsGPerL?: Record<string, number>;
	componentsGPerL?: Record<string, number>;
	elementsG?: Record<string, number>;
	componentsG?: Record<string, number>;
}

export interface SupplyInput {
	/** Final culture volume, L; defaults to the sum of source volumes when every source has one. */
	finalVolumeL?: number;
	sources: SupplySource[];
}

/** How sure a yield is, and where it comes from; shown on its line. */
interface YieldBasis {
	confidence?: ValueConfidence;
	source?: string;
}

export type CarbonDemand =
	| ({ basis: 'component'; component: string; yieldGPerG: number } & YieldBasis)
	| ({ basis: 'element'; yieldGPerGCarbon: number } & YieldBasis);

export interface SufficiencyInput {
	profile: OrganismProfile;
	target: SufficiencyTarget;
	supply: SupplyInput;
	/** Default 1.2 (common practice); at least 1. */
	safetyFactor?: number;
	/** Yield on the carbon source, so that respired carbon counts in the carbon demand. */
	carbon?: CarbonDemand;
	/**
	 * Yields on further substrates (e.g. glutamine, or the sole nitrogen salt): each becomes the line
	 * demand = X / Yx/s on that component, replacing any requirement the profile gives for it.
	 */
	substrates?: SubstrateDemand[];
	/** Elements not assessed; default ['H', 'O']. */
	ignoreElements?: string[];
}

export interface SubstrateDemand extends YieldBasis {
	component: string;
	yieldGPerG: number;
	/** How the yield was obtained, shown on the line. */
	note?: string;
}

export interface SufficiencyLine {
	key: string;
	basis: SupplyBasis;
	demandGPerL: number;
	supplyGPerL: number;
	/** Element lines, and components with a known molar mass. */
	demandMmolPerL: number | null;
	supplyMmolPerL: number | null;
	/** supply / demand. */
	ratio: number;
	/** supply − safetyFactor × demand, g/L; negative when short. */
	marginGPerL: number;
	sufficient: boolean;
	maxBiomassGPerL: number | null;
	maxCellsPerMl: number | null;
	/** 'required': a shortfall sets the limit; 'trace': a shortfall is a warning, never the limit. */
	role: ElementRole;
	/** 'default': the table of default roles (elements), or the rule that the carbon source, substrates and components are required; 'profile': the profile's own. */
	roleFrom: 'default' | 'profile';
	/** How sure the composition value (or yield) behind the demand is. */
	confidence: ValueConfidence;
	/** Where that value comes from, when known. */
	source: string | null;
	note?: string;
}

export interface SufficiencyResult {
	target: { biomassGPerL: number | null; cellsPerMl: number | null; cellDryMassPg: number | null };
	safetyFactor: number;
	finalVolumeL: number | null;
	lines: SufficiencyLine[];
	/** The required line of lowest ratio; trace lines never limit. */
	limiting: { key: string; basis: SupplyBasis; ratio: number } | null;
	maximumSupportable: { biomassGPerL: number | null; cellsPerMl: number | null };
	/** Every required line has supply ≥ safety factor × demand. */
	sufficient: boolean;
	/** Trace lines short of safety factor × demand, and fractions that contradict the formula. */
	warnings: string[];
	notes: string[];
	/** Where the default roles come from (common practice). */
	defaultRolesBasis: string;
}

/** Supply a study asks for over demand when the user sets none (common practice). */
export const DEFAULT_SAFETY_FACTOR = 1.2;
export const DEFAULT_IGNORED_ELEMENTS = ['H', 'O'] as const;

function fail(message: string, field?: string): never {
	throw new ChemistryInputError(message, field ? { field } : {});
}

function finite(value: unknown, field: string, what: string): number {
	if (typeof value !== 'number' || !Number.isFinite(value))
		fail(`${what} must be a finite number`, field);
	return value;
}

function positive(value: unknown, field: string, what: string): number {
	const v = finite(value, field, what);
	if (v <= 0) fail(`${what} must be greater than 0, not ${v}`, field);
	return v;
}

function nonNegative(value: unknown, field: string, what: string): number {
	const v = finite(value, field, what);
	if (v < 0) fail(`${what} must not be negative, not ${v}`, field);
	return v;
}

function requireElement(symbol: string, field: string): void {
	if (!(symbol in ATOMIC_WEIGHTS))
		fail(`'${symbol}' is not an element symbol with a standard atomic weight`, field);
}

function readMap(
	value: unknown,
	field: string,
	basis: SupplyBasis,
	what: string
): Record<string, number> {
	if (value === undefined) return {};
	if (value === null || typeof value !== 'object' || Array.isArray(value))
		fail(`${what} must be an object of numbers`, field);
	const out: Record<string, number> = {};
	for (const [key, v] of Object.entries(value as Record<string, unknown>)) {
		if (basis === 'element') requireElement(key, `${field}.${key}`);
		out[key] = nonNegative(v, `${field}.${key}`, `${what} of ${key}`);
	}
	return out;
}

interface Supply {
	finalVolumeL: number | null;
	element: Map<string, number>;
	component: Map<string, number>;
}

function readSupply(input: unknown): Supply {
	if (input === null || typeof input !== 'object')
		fail('Supply must be an object with sources', 'supply');
	const supply = input as SupplyInput;
	if (!Array.isArray(supply.sources) || supply.sources.length === 0) {
		fail('Supply needs at least one source (the medium, feeds)', 'supply.sources');
	}
	const sources = supply.sources.map((raw, i) => {
		const field = `supply.sources.${i}`;
		if (raw === null || typeof raw !== 'object') fail('Each source must be an object', field);
		return {
			volumeL:
				raw.volumeL === undefined
					? undefined
					: positive(raw.volumeL, `${field}.volumeL`, 'Source volume'),
			elementsGPerL: readMap(
				raw.elementsGPerL,
				`${field}.elementsGPerL`,
				'element',
				'Element concentration'
			),
			componentsGPerL: readMap(
				raw.componentsGPerL,
				`${field}.componentsGPerL`,
				'component',
				'Component concentration'
			),
			elementsG: readMap(raw.elementsG, `${field}.elementsG`, 'element', 'Element amount'),
			componentsG: readMap(raw.componentsG, `${field}.componentsG`, 'component', 'Component amount')
		};
	});
	let finalVolumeL: number | null =
		supply.finalVolumeL === undefined
			? null
			: positive(supply.finalVolumeL, 'supply.finalVolumeL', 'Final volume');
	const needsVolume = sources.some(
		(s) =>
			s.volumeL !== undefined ||
			Object.keys(s.elementsG).length > 0 ||
			Object.keys(s.componentsG).length > 0
	);
	if (finalVolumeL === null && needsVolume) {
		if (sources.every((s) => s.volumeL !== undefined)) {
			finalVolumeL = sources.reduce((acc, s) => acc + (s.volumeL ?? 0), 0);
		} else {
			fail(
				'Final volume is needed: some sources give a volume or total grams while others do not',
				'supply.finalVolumeL'
			);
		}
	}
	const element = new Map<string, number>();
	const component = new Map<string, number>();
	const add = (target: Map<string, number>, key: string, gPerL: number) =>
		target.set(key, (target.get(key) ?? 0) + gPerL);
	for (const s of sources) {
		const dilution =
			s.volumeL !== undefined && finalVolumeL !== null ? s.volumeL / finalVolumeL : 1;
		for (const [k, v] of Object.entries(s.elementsGPerL)) add(element, k, v * dilution);
		for (const [k, v] of Object.entries(s.componentsGPerL)) add(component, k, v * dilution);
		for (const [k, v] of Object.entries(s.elementsG)) add(element, k, v / (finalVolumeL as number));
		for (const [k, v] of Object.entries(s.componentsG))
			add(component, k, v / (finalVolumeL as number));
	}
	return { finalVolumeL, element, component };
}

/** A line's role and the standing of its value. */
type LineStanding = Pick<SufficiencyLine, 'role' | 'roleFrom' | 'confidence' | 'source'>;

interface Requirement extends LineStanding {
	key: string;
	basis: SupplyBasis;
	demandGPerL: number;
	molarMassGPerMol: number | null;
	note?: string;
}

/** An element's standing: the profile's statement where it makes one, else the default role and 'unstated'. */
function elementStanding(symbol: string, statement: ElementStatement | undefined): LineStanding {
	return {
		role: statement?.role ?? defaultElementRole(symbol),
		roleFrom: statement?.role ? 'profile' : 'default',
		confidence: statement?.confidence ?? 'unstated',
		source: statement?.source ?? null
	};
}

/** The carbon source, a further substrate or a component demand: required; how sure, as given. */
function requiredStanding(basis: { confidence?: unknown; source?: unknown }, field: string): LineStanding {
	const { confidence, source } = basis;
	if (confidence !== undefined && !(VALUE_CONFIDENCES as readonly unknown[]).includes(confidence))
		fail(`Confidence must be one of ${VALUE_CONFIDENCES.join(', ')}`, `${field}.confidence`);
	if (source !== undefined && typeof source !== 'string') fail('Source must be text', `${field}.source`);
	return {
		role: 'required',
		roleFrom: 'default',
		confidence: (confidence as ValueConfidence | undefined) ?? 'unstated',
		source: (source as string | undefined) || null
	};
}

interface Target {
	biomassGPerL: number | null;
	cellsPerMl: number | null;
	cellDryMassPg: number | null;
}

/** Cell density to dry biomass, exact by the SI prefixes: 1 cell/mL × 1 pg/cell = 1e3 cells/L × 1e-12 g = 1e-9 g/L. */
export const G_PER_L_PER_CELL_PER_ML_PER_PG = 1e-9;

function readTarget(input: unknown, profileDryMassPg: number | null): Target {
	if (input === null || typeof input !== 'object')
		fail('Target must be { biomassGPerL } or { cellsPerMl }', 'target');
	if ('biomassGPerL' in input) {
		const x = positive(
			(input as { biomassGPerL: unknown }).biomassGPerL,
			'target.biomassGPerL',
			'Target biomass'
		);
		const pg = profileDryMassPg;
		return {
			biomassGPerL: x,
			cellsPerMl: pg ? x / (pg * G_PER_L_PER_CELL_PER_ML_PER_PG) : null,
			cellDryMassPg: pg
		};
	}
	if ('cellsPerMl' in input) {
		const t = input as { cellsPerMl: unknown; cellDryMassPg?: unknown };
		const cells = positive(t.cellsPerMl, 'target.cellsPerMl', 'Target cell density');
		const pg =
			t.cellDryMassPg !== undefined
				? positive(t.cellDryMassPg, 'target.cellDryMassPg', 'Cell dry mass')
				: profileDryMassPg;
		return {
			biomassGPerL: pg ? cells * pg * G_PER_L_PER_CELL_PER_ML_PER_PG : null,
			cellsPerMl: cells,
			cellDryMassPg: pg
		};
	}
	fail('Target must be { biomassGPerL } or { cellsPerMl }', 'target');
}

function resolveProfile(profile: unknown): Exclude<OrganismProfile, { kind: 'preset' }> {
	if (profile === null || typeof profile !== 'object')
		fail('Profile must be an object with a kind', 'profile');
	const p = profile as OrganismProfile;
	if (p.kind === 'preset') {
		const found = typeof p.id === 'string' ? findBiomassComposition(p.id) : undefined;
		if (!found) {
			fail(
				`Unknown biomass preset '${String(p.id)}'; available: ${BIOMASS_COMPOSITIONS.map((b) => b.id).join(', ')}`,
				'profile.id'
			);
		}
		// The table's own confidence for each value, under whatever the request states on top.
		const overrides = readElementStatements(p.elements, 'profile.elements', new Set(Object.keys(found.massFractions)));
		return {
			kind: 'elementalFractions',
			name: found.name,
			fractions: Object.fromEntries(
				Object.entries(found.massFractions).map(([k, v]) => [k, v.value])
			),
			cellDryMassPg: found.cellDryMassPg?.value,
			elements: Object.fromEntries(
				Object.entries(statementsOfComposition(found)).map(([k, v]) => [k, { ...v, ...overrides[k] }])
			),
			formula: found.formula ?? undefined,
			ashFraction: found.ashFraction?.value
		};
	}
	if (p.kind === 'elementalFractions' || p.kind === 'componentRequirements' || p.kind === 'perCell')
		return p;
	fail(
		`Unknown profile kind '${String((p as { kind?: unknown }).kind)}'; use 'preset', 'elementalFractions', 'componentRequirements' or 'perCell'`,
		'profile.kind'
	);
}

function requireBiomass(target: Target, why: string): number {
	if (target.biomassGPerL === null) {
		fail(
			`${why} needs the target as dry biomass: give target.cellDryMassPg (or the profile's) with cellsPerMl`,
			'target.cellDryMassPg'
		);
	}
	return target.biomassGPerL;
}

function buildRequirements(
	profile: Exclude<OrganismProfile, { kind: 'preset' }>,
	target: Target,
	ignored: Set<string>
): Requirement[] {
	const lines: Requirement[] = [];
	if (profile.kind === 'elementalFractions') {
		const fractions = readMap(profile.fractions, 'profile.fractions', 'element', 'Mass fraction');
		const sum = Object.values(fractions).reduce((a, b) => a + b, 0);
		if (sum > 1 + 1e-9)
			fail(
				`Mass fractions add up to ${sum.toFixed(4)}, more than 1 g per g dry biomass`,
				'profile.fractions'
			);
		const statements = readElementStatements(profile.elements, 'profile.elements', new Set(Object.keys(fractions)));
		const x = requireBiomass(target, 'An elemental profile');
		for (const [el, f] of Object.entries(fractions)) {
			if (ignored.has(el)) continue;
			if (f === 0) continue;
			lines.push({
				key: el,
				basis: 'element',
				demandGPerL: x * f,
				molarMassGPerMol: ATOMIC_WEIGHTS[el],
				...elementStanding(el, statements[el])
			});
		}
	} else if (profile.kind === 'componentRequirements') {
		const reqs = readMap(
			profile.requirementsGPerG,
			'profile.requirementsGPerG',
			'component',
			'Requirement'
		);
		const x = requireBiomass(target, 'A per-g-biomass profile');
		for (const [key, r] of Object.entries(reqs)) {
			if (r === 0) continue;
			lines.push({ key, basis: 'component', demandGPerL: x * r, molarMassGPerMol: null, ...requiredStanding({}, 'profile') });
		}
	} else {
		if (!Array.isArray(profile.consumption) || profile.consumption.length === 0) {
			fail('A per-cell profile needs a consumption list', 'profile.consumption');
		}
		if (target.cellsPerMl === null) {
			fail(
				'A per-cell profile needs the target in cells/mL, or a cell dry mass to convert g/L',
				'target'
			);
		}
		const cells = target.cellsPerMl;
		const elementKeys = new Set(
			profile.consumption.filter((c) => c !== null && typeof c === 'object' && c.basis === 'element').map((c) => c.key)
		);
		const statements = readElementStatements(profile.elements, 'profile.elements', elementKeys);
		profile.consumption.forEach((c, i) => {
			const field = `profile.consumption.${i}`;
			if (c === null || typeof c !== 'object' || typeof c.key !== 'string' || c.key === '') {
				fail('Each consumption entry needs a key', `${field}.key`);
			}
			if (c.basis !== 'element' && c.basis !== 'component')
				fail("Basis must be 'element' or 'component'", `${field}.basis`);
			if (c.basis === 'element') requireElement(c.key, `${field}.key`);
			if (c.basis === 'element' && ignored.has(c.key)) return;
			let molarMass: number | null = null;
			if (c.basis === 'element') molarMass = ATOMIC_WEIGHTS[c.key];
			else if (c.molarMassGPerMol !== undefined)
				molarMass = positive(c.molarMassGPerMol, `${field}.molarMassGPerMol`, 'Molar mass');
			else if (c.formula !== undefined) {
				try {
					molarMass = formulaMolarMass(c.formula);
				} catch (e) {
					if (e instanceof ChemistryInputError)
						fail(`Formula of '${c.key}': ${e.message}`, `${field}.formula`);
					throw e;
				}
			}
			const hasPg = c.pgPerCell !== undefined;
			const hasMmol = c.mmolPer1e9Cells !== undefined;
			if (hasPg === hasMmol) fail('Give exactly one of pgPerCell or mmolPer1e9Cells', field);
			let demandGPerL: number;
			if (hasPg) {
				demandGPerL =
					cells *
					nonNegative(c.pgPerCell, `${field}.pgPerCell`, 'Consumption') *
					G_PER_L_PER_CELL_PER_ML_PER_PG;
			} else {
				if (molarMass === null)
					fail(
						`'${c.key}' in mmol per 10^9 cells needs molarMassGPerMol or formula`,
						`${field}.molarMassGPerMol`
					);
				const q = nonNegative(c.mmolPer1e9Cells, `${field}.mmolPer1e9Cells`, 'Consumption');
				// cells/mL × 1e3 mL/L ÷ 1e9 × mmol = mmol/L; × g/mol ÷ 1e3 = g/L
				demandGPerL = ((cells * 1e3) / 1e9) * q * (molarMass / 1e3);
			}
			if (demandGPerL > 0)
				lines.push({
					key: c.key,
					basis: c.basis,
					demandGPerL,
					molarMassGPerMol: molarMass,
					...(c.basis === 'element' ? elementStanding(c.key, statements[c.key]) : requiredStanding({}, field))
				});
		});
	}
	return lines;
}

function applyCarbon(
	lines: Requirement[],
	carbon: unknown,
	profile: Exclude<OrganismProfile, { kind: 'preset' }>,
	target: Target,
	notes: string[]
): Requirement[] {
	const carbonLine = lines.find((l) => l.basis === 'element' && l.key === 'C');
	if (carbon === undefined) {
		if (carbonLine) {
			carbonLine.note =
				'Counts only the carbon built into biomass; respired carbon is not included. Give a yield on the carbon source for a realistic demand.';
		}
		return lines;
	}
	if (carbon === null || typeof carbon !== 'object')
		fail('Carbon must be { basis, ... } with a yield', 'carbon');
	const spec = carbon as CarbonDemand;
	const x = requireBiomass(target, 'A carbon yield');
	if (spec.basis === 'component') {
		if (typeof spec.component !== 'string' || spec.component === '')
			fail('Carbon source component id is needed', 'carbon.component');
		const y = positive(spec.yieldGPerG, 'carbon.yieldGPerG', 'Yield on the carbon source');
		const rest = lines.filter(
			(l) =>
				!(l.basis === 'element' && l.key === 'C') &&
				!(l.basis === 'component' && l.key === spec.component)
		);
		if (carbonLine)
			notes.push(
				`Carbon is assessed as ${spec.component} at Yx/s = ${y} g/g, which includes respired carbon; the element-C line is replaced.`
			);
		return [
			{
				key: spec.component,
				basis: 'component',
				demandGPerL: x / y,
				molarMassGPerMol: null,
				note: `X / Yx/s with Yx/s = ${y} g/g: includes the carbon respired to CO2`,
				...requiredStanding(spec, 'carbon')
			},
			...rest
		];
	}
	if (spec.basis === 'element') {
		const y = positive(spec.yieldGPerGCarbon, 'carbon.yieldGPerGCarbon', 'Yield on carbon');
		const fC = profile.kind === 'elementalFractions' ? profile.fractions.C : undefined;
		if (fC !== undefined && fC > 0 && y > 1 / fC) {
			fail(
				`Yield ${y} g biomass per g C is more than 1/f_C = ${(1 / fC).toFixed(3)}: the cells would hold more carbon than they take up`,
				'carbon.yieldGPerGCarbon'
			);
		}
		const rest = lines.filter((l) => !(l.basis === 'element' && l.key === 'C'));
		return [
			{
				key: 'C',
				basis: 'element',
				demandGPerL: x / y,
				molarMassGPerMol: ATOMIC_WEIGHTS.C,
				note: `X / Yx/C with Yx/C = ${y} g per g C: includes the carbon respired to CO2`,
				...requiredStanding(spec, 'carbon')
			},
			...rest
		];
	}
	fail("Carbon basis must be 'component' or 'element'", 'carbon.basis');
}

function applySubstrates(lines: Requirement[], substrates: unknown, target: Target): Requirement[] {
	if (substrates === undefined) return lines;
	if (!Array.isArray(substrates)) fail('substrates must be a list of { component, yieldGPerG }', 'substrates');
	if (substrates.length === 0) return lines;
	const x = requireBiomass(target, 'A yield on a substrate');
	const seen = new Set<string>();
	const added: Requirement[] = substrates.map((entry: unknown, i) => {
		const field = `substrates.${i}`;
		if (entry === null || typeof entry !== 'object') fail('Each substrate needs { component, yieldGPerG }', field);
		const { component, yieldGPerG, note, confidence, source } = entry as SubstrateDemand;
		if (typeof component !== 'string' || component === '') fail('Substrate component id is needed', `${field}.component`);
		if (seen.has(component)) fail(`${component} is listed twice among the substrates`, `${field}.component`);
		seen.add(component);
		const y = positive(yieldGPerG, `${field}.yieldGPerG`, `Yield on ${component}`);
		return {
			key: component,
			basis: 'component' as const,
			demandGPerL: x / y,
			molarMassGPerMol: null,
			note: note ?? `X / Yx/s with Yx/s = ${y} g/g`,
			...requiredStanding({ confidence, source }, field)
		};
	});
	return [...lines.filter((l) => !(l.basis === 'component' && seen.has(l.key))), ...added];
}

/**
 * Assess a supply against a target biomass for an organism profile. See the module comment for the
 * rules; every demand, supply and margin is in g per litre of final volume.
 */
export function assessSufficiency(input: SufficiencyInput): SufficiencyResult {
	if (input === null || typeof input !== 'object') fail('Sufficiency input must be an object');
	const safetyFactor =
		input.safetyFactor === undefined
			? DEFAULT_SAFETY_FACTOR
			: finite(input.safetyFactor, 'safetyFactor', 'Safety factor');
	if (safetyFactor < 1)
		fail(`Safety factor must be at least 1, not ${safetyFactor}`, 'safetyFactor');
	const ignoredList = input.ignoreElements ?? [...DEFAULT_IGNORED_ELEMENTS];
	if (!Array.isArray(ignoredList))
		fail('ignoreElements must be a list of element symbols', 'ignoreElements');
	ignoredList.forEach((el, i) => requireElement(el, `ignoreElements.${i}`));
	const ignored = new Set(ignoredList);

	const profile = resolveProfile(input.profile);
	const profileDryMassPg =
		profile.cellDryMassPg === undefined
			? null
			: positive(profile.cellDryMassPg, 'profile.cellDryMassPg', 'Cell dry mass');
	const target = readTarget(input.target, profileDryMassPg);
	const supply = readSupply(input.supply);
	const notes: string[] = [];
	const requirements = applyCarbon(
		buildRequirements(profile, target, ignored),
		input.carbon,
		profile,
		target,
		notes
	);
	const withSubstrates = applySubstrates(requirements, input.substrates, target);
	if (withSubstrates.length === 0) fail('The profile has no requirement to assess', 'profile');

	const lines: SufficiencyLine[] = withSubstrates.map((r) => {
		const supplyGPerL = (r.basis === 'element' ? supply.element : supply.component).get(r.key) ?? 0;
		const ratio = supplyGPerL / r.demandGPerL;
		const line: SufficiencyLine = {
			key: r.key,
			basis: r.basis,
			demandGPerL: r.demandGPerL,
			supplyGPerL,
			demandMmolPerL: r.molarMassGPerMol ? (r.demandGPerL / r.molarMassGPerMol) * 1000 : null,
			supplyMmolPerL: r.molarMassGPerMol ? (supplyGPerL / r.molarMassGPerMol) * 1000 : null,
			ratio,
			marginGPerL: supplyGPerL - safetyFactor * r.demandGPerL,
			sufficient: ratio >= safetyFactor,
			maxBiomassGPerL:
				target.biomassGPerL === null ? null : (target.biomassGPerL * ratio) / safetyFactor,
			maxCellsPerMl: target.cellsPerMl === null ? null : (target.cellsPerMl * ratio) / safetyFactor,
			role: r.role,
			roleFrom: r.roleFrom,
			confidence: r.confidence,
			source: r.source
		};
		if (r.note) line.note = r.note;
		if (supplyGPerL === 0)
			line.note = [line.note, 'Not supplied by any source.'].filter(Boolean).join(' ');
		return line;
	});
	const required = lines.filter((l) => l.role === 'required');
	if (required.length === 0) {
		fail(
			`Every line of this profile (${lines.map((l) => l.key).join(', ')}) is a trace element, and trace elements never set the limit: mark at least one as required, or give a yield on the carbon source`,
			'profile'
		);
	}
	let limiting = required[0];
	for (const line of required) if (line.ratio < limiting.ratio) limiting = line;
	const warnings = [
		...checkProfileFormula(profile),
		...lines.filter((l) => l.role === 'trace' && !l.sufficient).map((l) => describeShortTrace(l, target, safetyFactor))
	];
	return {
		target,
		safetyFactor,
		finalVolumeL: supply.finalVolumeL,
		lines,
		limiting: { key: limiting.key, basis: limiting.basis, ratio: limiting.ratio },
		maximumSupportable: {
			biomassGPerL: limiting.maxBiomassGPerL,
			cellsPerMl: limiting.maxCellsPerMl
		},
		sufficient: required.every((l) => l.sufficient),
		warnings,
		notes,
		defaultRolesBasis: DEFAULT_ELEMENT_ROLES_BASIS
	};
}

const significant = (value: number) => String(Number(value.toPrecision(3)));

/** A trace line short of safety factor × demand, in one sentence that names it and what it would allow. */
function describeShortTrace(line: SufficiencyLine, target: Target, safetyFactor: number): string {
	const share =
		target.biomassGPerL === null
			? `${significant(line.demandGPerL)} g/L at the target`
			: `${formatPercentOfDryMass(line.demandGPerL / target.biomassGPerL)} % of dry mass`;
	const value = `${share}, ${VALUE_CONFIDENCE_WORDS[line.confidence]}`;
	const advice = 'a trace element does not set the limit; check that the water, the salts or a trace-element solution carry enough of it for this organism.';
	if (line.supplyGPerL === 0) return `${line.key} is in no source (the profile counts it at ${value}): ${advice}`;
	const allows = line.maxBiomassGPerL === null ? '' : `, enough for about ${significant(line.maxBiomassGPerL)} g/L at safety factor ${safetyFactor}`;
	return `${line.key} covers ${significant(line.ratio)} × its demand (the profile counts it at ${value})${allows}: ${advice}`;
}

/** The fractions of an elemental profile against its formula, when it gives one. */
function checkProfileFormula(profile: Exclude<OrganismProfile, { kind: 'preset' }>): string[] {
	if (profile.kind !== 'elementalFractions' || profile.formula === undefined) return [];
	if (typeof profile.formula !== 'string' || profile.formula.trim() === '') fail('Biomass formula must be text, e.g. CH1.8O0.5N0.2', 'profile.formula');
	let ashFraction: number | null = null;
	if (profile.ashFraction !== undefined) {
		ashFraction = nonNegative(profile.ashFraction, 'profile.ashFraction', 'Ash fraction');
		if (ashFraction >= 1) fail(`Ash fraction must be below 1 g per g dry biomass, not ${ashFraction}`, 'profile.ashFraction');
	}
	return compareFractionsWithFormula({ formula: profile.formula, ashFraction, fractions: profile.fractions, field: 'profile.formula' }).map((m) => m.message);
}
