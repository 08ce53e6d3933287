/**
 * What a recipe puts in the liquid: per component g/L and mM, per element g/L and mmol/L, an
 * osmolality estimate Σ c·ν·φ, ionic strength ½ Σ c z², and solubility and precipitation warnings.
 */
import { ChemistryInputError } from './errors';
import { readBetween } from './input';
import {
	type ComponentSpec,
	type ResolvedComponent,
	type IonSpec,
	ionBase,
	resolveComponent,
	solubilityAt
} from './components';
import { checkAmount, toGramsPerLitre } from './units';

export interface CompositionLine {
	component: ComponentSpec;
	amount: number;
	unit: string;
}

export interface CompositionInput {
	lines: CompositionLine[];
	/** Preparation temperature for the solubility check; 25 °C when omitted. */
	temperatureC?: number;
	/** Batch volume; when given, each component also gets the mass it needs. */
	volumeL?: number;
}

export interface ComponentComposition {
	id: string;
	name: string;
	lineIndex: number;
	gPerL: number;
	/** null without a formula or molar mass. */
	mM: number | null;
	molarMassGPerMol: number | null;
	massG: number | null;
	particlesPerUnit: number | null;
	osmoticCoefficient: number | null;
	osmoticCoefficientSource: string | null;
	osmolalityMOsmPerKg: number | null;
}

export interface ElementComposition {
	symbol: string;
	gPerL: number;
	mmolPerL: number;
}

export type CompositionWarningKind = 'solubility' | 'precipitation';

export interface CompositionWarning {
	kind: CompositionWarningKind;
	/** 'published value' for a handbook solubility, 'common practice' for a rule of thumb. */
	basis: 'published value' | 'common practice';
	message: string;
	componentIds: string[];
	lineIndexes: number[];
	/** Precipitation warnings: the product of the rule that flagged it. */
	precipitate?: (typeof PRECIPITATION_RULES)[number]['product'];
}

export interface CompositionResult {
	components: ComponentComposition[];
	elements: ElementComposition[];
	totalCarbonGPerL: number;
	totalNitrogenGPerL: number;
	osmolality: {
		estimateMOsmPerKg: number;
		idealMOsmPerL: number;
		/** Components without a molar mass (complex materials), left out of the estimate. */
		excludedComponentIds: string[];
		note: string;
	};
	ionicStrengthMolPerL: number;
	/** Σ g/L of every line as weighed (hydrate water included): what a litre carries in solution. */
	dissolvedSolidsGPerL: number;
	temperatureC: number;
	warnings: CompositionWarning[];
}

/** Always listed, in this order, even at zero; any other element present follows alphabetically. */
export const REPORTED_ELEMENTS = [
	'C',
	'H',
	'O',
	'N',
	'P',
	'S',
	'K',
	'Na',
	'Cl',
	'Mg',
	'Ca',
	'Fe',
	'Zn',
	'Mn',
	'Cu',
	'Co',
	'Mo',
	'Se'
] as const;

export const OSMOLALITY_NOTE =
	'An estimate: Σ c·ν·φ with the osmotic coefficient φ shown per component (most measured at physiological concentration, 37 °C). mOsm/L is taken as mOsm/kg, which holds for dilute media; ions are counted as the salts are written (pH speciation ignored) and complex materials are left out. Measure with an osmometer before use.';

/**
 * Precipitation pairs flagged when both partners reach the stated concentrations. Common practice:
 * these salts are prepared or sterilised apart; the thresholds are rules of thumb chosen here, not
 * solubility products.
 */
export const PRECIPITATION_RULES = [
	{ cation: 'Ca', anion: 'phosphate', cationMinMM: 1, anionMinMM: 1, product: 'calcium phosphate' },
	{
		cation: 'Mg',
		anion: 'phosphate',
		cationMinMM: 1,
		anionMinMM: 10,
		product: 'magnesium phosphate'
	},
	{ cation: 'Ca', anion: 'carbonate', cationMinMM: 1, anionMinMM: 1, product: 'calcium carbonate' },
	{
		cation: 'Mg',
		anion: 'carbonate',
		cationMinMM: 1,
		anionMinMM: 10,
		product: 'magnesium carbonate'
	},
	{ cation: 'Fe', anion: 'phosphate', cationMinMM: 0.01, anionMinMM: 1, product: 'iron phosphate' }
] as const;

export type PrecipitationSpecies = (typeof PRECIPITATION_RULES)[number]['cation' | 'anion'];

const ANION_GROUPS: Record<string, 'phosphate' | 'carbonate'> = {
	PO4: 'phosphate',
	HPO4: 'phosphate',
	H2PO4: 'phosphate',
	CO3: 'carbonate',
	HCO3: 'carbonate'
};
const CATIONS = new Set<string>(PRECIPITATION_RULES.map((r) => r.cation));

/**
 * The species of the precipitation rules a salt gives, with how many per formula unit: Ca, Mg, Fe
 * as cations, phosphate and carbonate in any protonation.
 */
export function precipitationSpeciesOf(
	ions: readonly IonSpec[]
): { species: PrecipitationSpecies; count: number }[] {
	const out: { species: PrecipitationSpecies; count: number }[] = [];
	for (const ion of ions) {
		const base = ionBase(ion.ion);
		const species = CATIONS.has(base) && ion.charge > 0 ? base : ANION_GROUPS[base];
		if (species) out.push({ species: species as PrecipitationSpecies, count: ion.count });
	}
	return out;
}

function formatNumber(value: number): string {
	return Number(value.toPrecision(3)).toString();
}

export function computeComposition(input: CompositionInput): CompositionResult {
	if (!input || !Array.isArray(input.lines)) {
		throw new ChemistryInputError('Lines must be a list', { field: 'lines' });
	}
	if (input.temperatureC !== undefined) {
		readBetween(input.temperatureC, 'temperatureC', -10, 100, 'Temperature (°C)');
	}
	if (input.volumeL !== undefined) checkAmount(input.volumeL, 'volumeL');
	const temperatureC = input.temperatureC ?? 25;
	const volumeL = input.volumeL ?? null;

	const components: ComponentComposition[] = [];
	const warnings: CompositionWarning[] = [];
	const seen = new Map<string, number>();
	const totals: Totals = {
		elementMol: new Map(),
		elementG: new Map(),
		speciesMM: new Map(),
		excludedComponentIds: [],
		osmolality: 0,
		idealOsmolarity: 0,
		ionicStrength: 0,
		dissolvedSolids: 0
	};

	input.lines.forEach((line, index) => {
		const { resolved, gPerL } = readLine(line, index, seen);
		const { spec } = resolved;
		const molarMass = resolved.molarMassGPerMol;
		const mM = molarMass === null ? null : (gPerL / molarMass) * 1000;
		const contribution = addToTotals(totals, resolved, gPerL, mM, index);

		if (resolved.solubility) {
			const warning = checkSolubility(spec, resolved.solubility, gPerL, mM, temperatureC, index);
			if (warning !== null) warnings.push(warning);
		}

		components.push({
			id: spec.id,
			name: spec.name,
			lineIndex: index,
			gPerL,
			mM,
			molarMassGPerMol: molarMass,
			massG: volumeL === null ? null : gPerL * volumeL,
			particlesPerUnit: resolved.particlesPerUnit,
			osmoticCoefficient: contribution === null ? null : resolved.osmoticCoefficient,
			osmoticCoefficientSource: contribution === null ? null : resolved.osmoticCoefficientSource,
			osmolalityMOsmPerKg: contribution
		});
	});

	warnings.push(...flagPrecipitation(totals.speciesMM, components));
	const { elementG } = totals;
	const elements = listElements(elementG, totals.elementMol);

	return {
		components,
		elements,
		totalCarbonGPerL: elementG.get('C') ?? 0,
		totalNitrogenGPerL: elementG.get('N') ?? 0,
		osmolality: {
			estimateMOsmPerKg: totals.osmolality,
			idealMOsmPerL: totals.idealOsmolarity,
			excludedComponentIds: totals.excludedComponentIds,
			note: OSMOLALITY_NOTE
		},
		ionicStrengthMolPerL: totals.ionicStrength,
		dissolvedSolidsGPerL: totals.dissolvedSolids,
		temperatureC,
		warnings
	};
}

/** A warning when a line (on the solubility's basis) exceeds the solubility at the temperature. */
function checkSolubility(
	spec: ResolvedComponent['spec'],
	solubility: NonNullable<ResolvedComponent['solubility']>,
	gPerL: number,
	mM: number | null,
	temperatureC: number,
	index: number
): CompositionWarning | null {
	const { points, basisMolarMassGPerMol, source } = solubility;
	const limit = solubilityAt(points, temperatureC);
	const basisGPerL =
		basisMolarMassGPerMol !== null && mM !== null ? (mM / 1000) * basisMolarMassGPerMol : gPerL;
	if (basisGPerL <= limit.gPerL) return null;
	const sourced = points.map((p) => `${p.temperatureC} °C`).join(', ');
	let where: string;
	if (limit.exact) where = `at ${temperatureC} °C`;
	else if (points.length === 1)
		where = `at ${points[0].temperatureC} °C (no temperature dependence known; preparation at ${temperatureC} °C)`;
	else if (!limit.withinRange)
		where = `at the nearest sourced temperature (sourced: ${sourced}; preparation at ${temperatureC} °C)`;
	else where = `at ${temperatureC} °C (interpolated between ${sourced})`;
	const basisText = basisMolarMassGPerMol !== null ? ' as the anhydrous/basis form' : '';
	return {
		kind: 'solubility',
		basis: 'published value',
		message: `${spec.name} at ${formatNumber(basisGPerL)} g/L${basisText} exceeds its solubility of about ${formatNumber(limit.gPerL)} g/L ${where}; source: ${source}`,
		componentIds: [spec.id],
		lineIndexes: [index]
	};
}

/** Precipitation pairs above their flag concentrations (common practice; see PRECIPITATION_RULES). */
function flagPrecipitation(
	speciesMM: Map<string, { mM: number; lines: Set<number> }>,
	components: ComponentComposition[]
): CompositionWarning[] {
	const warnings: CompositionWarning[] = [];
	for (const rule of PRECIPITATION_RULES) {
		const cation = speciesMM.get(rule.cation);
		const anion = speciesMM.get(rule.anion);
		if (!cation || !anion || cation.mM < rule.cationMinMM || anion.mM < rule.anionMinMM) continue;
		const lineIndexes = [...new Set([...cation.lines, ...anion.lines])].sort((a, b) => a - b);
		warnings.push({
			kind: 'precipitation',
			basis: 'common practice',
			message: `Risk of ${rule.product} precipitating: ${rule.cation} ${formatNumber(cation.mM)} mM with ${rule.anion} ${formatNumber(anion.mM)} mM (flagged from ${rule.cationMinMM} mM ${rule.cation} and ${rule.anionMinMM} mM ${rule.anion}, common practice). Dissolve and sterilise them apart, add the ${rule.cation} salt last to the diluted medium, and watch pH and heating.`,
			componentIds: lineIndexes.map((i) => components[i].id),
			lineIndexes,
			precipitate: rule.product
		});
	}
	return warnings;
}

/** The reported elements first, in their order, then any others alphabetically. */
function listElements(
	elementG: Map<string, number>,
	elementMol: Map<string, number>
): ElementComposition[] {
	const elements: ElementComposition[] = [];
	const extra = [...elementG.keys()]
		.filter((s) => !(REPORTED_ELEMENTS as readonly string[]).includes(s))
		.sort();
	for (const symbol of [...REPORTED_ELEMENTS, ...extra]) {
		elements.push({
			symbol,
			gPerL: elementG.get(symbol) ?? 0,
			mmolPerL: (elementMol.get(symbol) ?? 0) * 1000
		});
	}
	return elements;
}

/** The recipe's running sums over its lines. */
interface Totals {
	elementMol: Map<string, number>;
	elementG: Map<string, number>;
	/** mM of each precipitation species and the lines that bring it */
	speciesMM: Map<string, { mM: number; lines: Set<number> }>;
	excludedComponentIds: string[];
	osmolality: number;
	idealOsmolarity: number;
	ionicStrength: number;
	dissolvedSolids: number;
}

/** Adds a line to the totals; returns its osmolality contribution, null when it has no molar mass. */
function addToTotals(
	totals: Totals,
	resolved: ResolvedComponent,
	gPerL: number,
	mM: number | null,
	index: number
): number | null {
	const { elementG, elementMol, speciesMM } = totals;
	totals.dissolvedSolids += gPerL;
	for (let i = 0; i < resolved.elementSymbols.length; i++) {
		const symbol = resolved.elementSymbols[i];
		elementG.set(symbol, (elementG.get(symbol) ?? 0) + gPerL * resolved.elementGPerG[i]);
		elementMol.set(symbol, (elementMol.get(symbol) ?? 0) + gPerL * resolved.elementMolPerG[i]);
	}
	if (mM === null || resolved.particlesPerUnit === null) {
		totals.excludedComponentIds.push(resolved.spec.id);
		return null;
	}
	totals.idealOsmolarity += mM * resolved.particlesPerUnit;
	const contribution = mM * resolved.particlesPerUnit * resolved.osmoticCoefficient;
	totals.osmolality += contribution;
	totals.ionicStrength += (mM / 1000) * resolved.ionicStrengthPerMolar;
	for (const { species, count } of precipitationSpeciesOf(resolved.ions)) {
		const entry = speciesMM.get(species) ?? { mM: 0, lines: new Set<number>() };
		entry.mM += mM * count;
		entry.lines.add(index);
		speciesMM.set(species, entry);
	}
	return contribution;
}

/** A line's component, resolved and not already on an earlier line, and its concentration in g/L. */
function readLine(
	line: CompositionLine,
	index: number,
	seen: Map<string, number>
): { resolved: ResolvedComponent; gPerL: number } {
	const prefix = `lines.${index}`;
	if (!line || typeof line !== 'object')
		throw new ChemistryInputError('Line is missing', { field: prefix });
	const resolved = resolveComponent(line.component, `${prefix}.component`);
	const { spec } = resolved;
	const earlier = seen.get(spec.id);
	if (earlier !== undefined) {
		throw new ChemistryInputError(
			`${spec.name} is already on line ${earlier + 1}; combine the two lines`,
			{
				field: `${prefix}.component`
			}
		);
	}
	seen.set(spec.id, index);

	const gPerL = toGramsPerLitre(
		line.amount,
		line.unit,
		resolved.molarMassGPerMol,
		`${prefix}.amount`,
		`${prefix}.unit`
	);
	return { resolved, gPerL };
}
