import {
	ChemistryInputError,
	computeComposition,
	hydrateFactor,
	toGramsPerLitre,
	type CompositionResult,
	type ElementComposition,
	type GhsHazard,
	classifySolution
} from '$chemistry';
import { convertVolume } from '$lib/quantities';
import { db, type Db } from '../db';
import type { Component } from '../db/schema';
import { RuleError } from '../rule-error';
import { componentSpecOf, findComponentsByIds, molarMassOfComponent } from '../components/library';
import {
	currentApprovedVersion,
	findRecipe,
	findVersionById,
	latestVersion,
	linesOf
} from './queries';
import { componentSnapshotOf } from './snapshot';

type Reader = Pick<Db, 'select'>;

/** What the analysis needs of a line, whether typed in the editor or stored. */
export interface AnalysisLine {
	kind: 'component' | 'stock';
	componentId: string | null;
	shelfFormId: string | null;
	stockRecipeId: string | null;
	/** A stored line's pinned stock version; otherwise the stock's current approved version is used. */
	stockVersionId?: string | null;
	amount: number;
	unit: string;
}

export interface AnalysisOptions {
	temperatureC: number;
	osmolalityMinMOsmPerKg: number | null;
	osmolalityMaxMOsmPerKg: number | null;
	/** The recipe being analysed, so a stock cannot contain it. */
	recipeId?: string | null;
	/** The stored version analysed: once submitted, its lines compute with its component snapshot. */
	versionId?: string | null;
}

/** Components by id that a version computes with instead of the library's current rows. */
type Snapshot = Map<string, Component>;

export type OsmolalityVerdict = 'within' | 'below' | 'above' | 'no-target';

export interface RecipeAnalysis {
	components: {
		id: string;
		name: string;
		gPerL: number;
		mM: number | null;
		osmolalityMOsmPerKg: number | null;
		osmoticCoefficient: number | null;
		/** Editor lines (0-based) it comes from: its own line, or stock lines that carry it. */
		lines: number[];
	}[];
	elements: ElementComposition[];
	totalCarbonGPerL: number;
	totalNitrogenGPerL: number;
	osmolality: CompositionResult['osmolality'] & {
		excludedNames: string[];
		minMOsmPerKg: number | null;
		maxMOsmPerKg: number | null;
		verdict: OsmolalityVerdict;
	};
	ionicStrengthMolPerL: number;
	/** Σ g/L of the components as weighed. */
	dissolvedSolidsGPerL: number;
	temperatureC: number;
	warnings: {
		kind: 'solubility' | 'precipitation';
		basis: string;
		message: string;
		lines: number[];
	}[];
	/** Which stock versions were used, and anything provisional about them. */
	notes: string[];
	hazards: (GhsHazard & { components: string[] })[];
}

interface Contribution {
	component: Component;
	gPerL: number;
	lines: Set<number>;
}

const MAX_STOCK_DEPTH = 5;

class Expander {
	readonly notes: string[] = [];
	private readonly components = new Map<string, Component>();

	constructor(
		private readonly reader: Reader,
		private readonly ownSnapshot: Snapshot
	) {}

	private component(id: string, snapshot: Snapshot): Component {
		const kept = snapshot.get(id);
		if (kept) return kept;
		let found = this.components.get(id);
		if (!found) {
			found = findComponentsByIds([id], this.reader).get(id);
			if (!found) throw new RuleError(`No component “${id}” in the library.`);
			this.components.set(id, found);
		}
		return found;
	}

	preload(ids: (string | null)[]) {
		for (const [id, c] of findComponentsByIds(
			ids.filter((i): i is string => Boolean(i)),
			this.reader
		))
			this.components.set(id, c);
	}

	/** g/L of the form that goes into the liquid (the shelf form when one is named). */
	componentLine(
		line: AnalysisLine,
		field: string,
		snapshot: Snapshot = this.ownSnapshot
	): { component: Component; gPerL: number } {
		const base = this.component(line.componentId!, snapshot);
		const baseMolarMass = molarMassOfComponent(base);
		const basisGPerL = toGramsPerLitre(
			line.amount,
			line.unit,
			baseMolarMass,
			`${field}.amount`,
			`${field}.unit`
		);
		if (!line.shelfFormId || line.shelfFormId === base.id)
			return { component: base, gPerL: basisGPerL };
		const shelf = this.component(line.shelfFormId, snapshot);
		const shelfMolarMass = molarMassOfComponent(shelf);
		if (baseMolarMass === null || shelfMolarMass === null) {
			throw new RuleError(
				`${shelf.name} and ${base.name} both need a formula to weigh one as the other.`,
				{ field: `${field}.shelfFormId` }
			);
		}
		// One basis unit per shelf formula unit: the same moles, weighed as the heavier form.
		return { component: shelf, gPerL: basisGPerL * hydrateFactor(shelfMolarMass, baseMolarMass) };
	}

	/** g/L of each component in one stock, expanded through stocks it contains. */
	stockContents(
		line: AnalysisLine,
		field: string,
		trail: string[]
	): Map<string, { component: Component; gPerL: number }> {
		const stock = findRecipe(line.stockRecipeId!, this.reader);
		if (!stock)
			throw new RuleError(`No stock solution “${line.stockRecipeId}”.`, {
				field: `${field}.stockRecipeId`
			});
		if (trail.includes(stock.id) || trail.length > MAX_STOCK_DEPTH) {
			throw new RuleError(
				`${stock.name} contains, through its stocks, the recipe it is added to.`,
				{ field: `${field}.stockRecipeId` }
			);
		}
		let version = line.stockVersionId
			? findVersionById(line.stockVersionId, this.reader)
			: undefined;
		if (!version) version = currentApprovedVersion(stock.id, this.reader);
		if (!version) {
			version = latestVersion(stock.id, this.reader);
			if (version)
				this.notes.push(
					`${stock.name} has no approved version yet: its version ${version.n} (${version.status.replace('_', ' ')}) is used, and this recipe cannot be approved until it is.`
				);
		} else {
			this.notes.push(`${stock.name}: version ${version.n} (${version.status.replace('_', ' ')}).`);
		}
		const out = new Map<string, { component: Component; gPerL: number }>();
		if (!version) return out;
		const snapshot = componentSnapshotOf(version.id, this.reader);
		for (const inner of linesOf(version.id, this.reader)) {
			const parts =
				inner.kind === 'stock'
					? [...this.stockContents(inner, field, [...trail, stock.id]).values()].map((p) => ({
							...p,
							gPerL: p.gPerL * convertVolume(inner.amount, 'mL', 'L')
						}))
					: [this.componentLine(inner, field, snapshot)];
			for (const part of parts) {
				const entry = out.get(part.component.id);
				if (entry) entry.gPerL += part.gPerL;
				else out.set(part.component.id, { ...part });
			}
		}
		return out;
	}
}

function verdictOf(estimate: number, min: number | null, max: number | null): OsmolalityVerdict {
	if (min === null && max === null) return 'no-target';
	if (min !== null && estimate < min) return 'below';
	if (max !== null && estimate > max) return 'above';
	return 'within';
}

/** Each line's components (a stock's scaled by its dose in mL/L), merged per component. */
function mergeLines(lines: AnalysisLine[], expander: Expander, trail: string[]): Contribution[] {
	const merged = new Map<string, Contribution>();
	const add = (part: { component: Component; gPerL: number }, index: number) => {
		const entry = merged.get(part.component.id);
		if (entry) {
			entry.gPerL += part.gPerL;
			entry.lines.add(index);
		} else merged.set(part.component.id, { ...part, lines: new Set([index]) });
	};
	try {
		lines.forEach((line, index) => {
			const field = `lines.${index}`;
			if (line.kind === 'stock') {
				for (const part of expander.stockContents(line, field, trail).values()) {
					add(
						{
							component: part.component,
							gPerL: part.gPerL * convertVolume(line.amount, 'mL', 'L')
						},
						index
					);
				}
			} else add(expander.componentLine(line, field), index);
		});
	} catch (cause) {
		if (cause instanceof ChemistryInputError)
			throw new RuleError(cause.message, { field: cause.field });
		throw cause;
	}
	return [...merged.values()];
}

/** The chemistry library's composition of the merged entries; its errors point at a recipe line. */
function composeEntries(entries: Contribution[], temperatureC: number): CompositionResult {
	try {
		return computeComposition({
			lines: entries.map((e) => ({
				component: componentSpecOf(e.component),
				amount: e.gPerL,
				unit: 'g/L'
			})),
			temperatureC
		});
	} catch (cause) {
		if (!(cause instanceof ChemistryInputError)) throw cause;
		// The engine speaks of merged entries; point the user at the first line behind the entry.
		const merged = /^lines\.(\d+)/.exec(cause.field ?? '');
		const line = merged ? Math.min(...entries[Number(merged[1])].lines) : null;
		throw new RuleError(cause.message, {
			field: line === null ? cause.field : `lines.${line}.componentId`
		});
	}
}

/** A dilute aqueous solution weighs about 1 kg per litre (common practice), so g/L ÷ 1000 is g/g. */
const SOLUTION_G_PER_L = 1000;

/**
 * The GHS statements of the solution itself at its concentrations (UN GHS mixture rules in
 * chemistry/hazards), each with the components that carry it: a trace stock dosed at 1 mL/L adds
 * nothing it does not carry at that strength. What the pure components carry while being weighed is
 * the batch sheet's business (batches/preparation-hazards.ts).
 */
function hazardsOf(entries: Contribution[]): (GhsHazard & { components: string[] })[] {
	const hazardous = entries.filter(({ component }) => component.ghsHazards.length > 0);
	// A very concentrated feed can hold more than 1 kg of these solids per litre, where the 1 kg/L
	// estimate fails: each is then taken as its share of those solids alone, an upper bound of its
	// true share, since the solution also holds water.
	const totalGPerL = hazardous.reduce((sum, e) => sum + e.gPerL, 0);
	const perGram = Math.max(SOLUTION_G_PER_L, totalGPerL);
	const classified = classifySolution(
		hazardous.map(({ component, gPerL }) => ({
			name: component.name,
			massFraction: gPerL / perGram,
			hazards: component.ghsHazards
		}))
	);
	return classified.hazards.map((h) => ({ code: h.code, text: h.text, components: h.ingredients }));
}

/**
 * The composition of a recipe: its component lines, plus the components of its stocks scaled by
 * dose/1000, merged per component, then put through the chemistry library.
 */
export function analyseLines(
	lines: AnalysisLine[],
	options: AnalysisOptions,
	reader: Reader = db
): RecipeAnalysis {
	const expander = new Expander(
		reader,
		options.versionId ? componentSnapshotOf(options.versionId, reader) : new Map()
	);
	expander.preload(lines.flatMap((l) => [l.componentId, l.shelfFormId]));
	const entries = mergeLines(lines, expander, options.recipeId ? [options.recipeId] : []);
	const result = composeEntries(entries, options.temperatureC);
	const linesOfEntries = (indexes: number[]) =>
		[...new Set(indexes.flatMap((i) => [...entries[i].lines]))].sort((a, b) => a - b);
	const hazards = hazardsOf(entries);
	const excluded = new Set(result.osmolality.excludedComponentIds);
	return {
		components: result.components.map((c) => ({
			id: c.id,
			name: c.name,
			gPerL: c.gPerL,
			mM: c.mM,
			osmolalityMOsmPerKg: c.osmolalityMOsmPerKg,
			osmoticCoefficient: c.osmoticCoefficient,
			lines: linesOfEntries([c.lineIndex])
		})),
		elements: result.elements,
		totalCarbonGPerL: result.totalCarbonGPerL,
		totalNitrogenGPerL: result.totalNitrogenGPerL,
		osmolality: {
			...result.osmolality,
			excludedNames: entries
				.filter((e) => excluded.has(e.component.id))
				.map((e) => e.component.name),
			minMOsmPerKg: options.osmolalityMinMOsmPerKg,
			maxMOsmPerKg: options.osmolalityMaxMOsmPerKg,
			verdict: verdictOf(
				result.osmolality.estimateMOsmPerKg,
				options.osmolalityMinMOsmPerKg,
				options.osmolalityMaxMOsmPerKg
			)
		},
		ionicStrengthMolPerL: result.ionicStrengthMolPerL,
		dissolvedSolidsGPerL: result.dissolvedSolidsGPerL,
		temperatureC: result.temperatureC,
		warnings: result.warnings.map((w) => ({
			kind: w.kind,
			basis: w.basis,
			message: w.message,
			lines: linesOfEntries(w.lineIndexes)
		})),
		notes: [...new Set(expander.notes)],
		hazards: hazards.sort((a, b) => a.code.localeCompare(b.code))
	};
}

/** The analysis of a stored version, with its pinned stock versions. */
export function analyseVersion(
	version: {
		id: string;
		recipeId: string;
		preparationTemperatureC: number;
		osmolalityMinMOsmPerKg: number | null;
		osmolalityMaxMOsmPerKg: number | null;
	},
	reader: Reader = db
): RecipeAnalysis {
	return analyseLines(
		linesOf(version.id, reader),
		{
			temperatureC: version.preparationTemperatureC,
			osmolalityMinMOsmPerKg: version.osmolalityMinMOsmPerKg,
			osmolalityMaxMOsmPerKg: version.osmolalityMaxMOsmPerKg,
			recipeId: version.recipeId,
			versionId: version.id
		},
		reader
	);
}
