// What a technician handles at each step of a preparation, and its hazards there (UN GHS, in
// chemistry/hazards): a component as weighed (the pure substance), a stock as dosed (the stock
// solution at its own strength), the acid or base of the pH step, and the finished solution. The
// protective equipment follows from those statements; our own notices (hot liquids) are plain words.
import {
	classifyPhAdjuster,
	labelElementsOf,
	phAdjustersNamedIn,
	protectiveEquipment
} from '$chemistry';
import type { HazardSet, PhStep, PreparationHazards } from '$lib/hazards/preparation';
import { findComponent } from '../components/library';
import { analyseVersion } from '../recipes/analysis';
import { currentApprovedVersion } from '../recipes/queries';
import { RuleError } from '../rule-error';

const EMPTY: HazardSet = { statements: [], pictograms: [], signalWord: null, ppe: [] };

export function hazardSetOf(statements: { code: string; text: string }[]): HazardSet {
	if (!statements.length) return EMPTY;
	const codes = statements.map((s) => s.code);
	const { pictograms, signalWord } = labelElementsOf(codes);
	return {
		statements,
		pictograms,
		signalWord,
		ppe: protectiveEquipment(codes).map(({ id, text }) => ({ id, text }))
	};
}

/** Hot solutions scald: common practice flags preparation above 40 °C. */
const HOT_PREPARATION_C = 40;

type Version = Parameters<typeof analyseVersion>[0] & {
	instructions: string;
	targetPh: number | null;
};

interface PreparedLine {
	id: string;
	kind: 'component' | 'stock';
	componentId: string | null;
	stockRecipeId: string | null;
	name: string;
}

/**
 * A version's solution at its own concentrations: its GHS statements (recipes/analysis.ts), or none
 * when it cannot be analysed (its own page says why).
 */
export function solutionStatements(
	version: Parameters<typeof analyseVersion>[0]
): { code: string; text: string }[] {
	try {
		return analyseVersion(version).hazards;
	} catch (cause) {
		if (cause instanceof RuleError) return [];
		throw cause;
	}
}

/** The approved stock as dosed; its aquatic statements are for disposal, not for the bench. */
function stockSolutionHazards(stockRecipeId: string): HazardSet {
	const version = currentApprovedVersion(stockRecipeId);
	if (!version) return EMPTY;
	return hazardSetOf(solutionStatements(version).filter((h) => !isAquatic(h.code)));
}

const isAquatic = (code: string) => /^H4[01]\d/.test(code);

function phStep(version: Version): PhStep | null {
	if (version.targetPh === null) return null;
	const named = phAdjustersNamedIn(version.instructions);
	return {
		agents: named.map((adjuster) => ({
			name: adjuster.name,
			workingSolution: adjuster.workingSolution,
			hazards: hazardSetOf(classifyPhAdjuster(adjuster).hazards.filter((h) => !h.environmental))
		})),
		unnamed: named.length
			? null
			: 'The instructions name no acid or base: use the ones your site’s procedure names. Strong acids and bases burn skin and eyes: wear goggles and gloves.'
	};
}

function unionPpe(sets: HazardSet[]): { id: string; text: string }[] {
	const byId = new Map<string, { id: string; text: string }>();
	for (const set of sets) for (const item of set.ppe) byId.set(item.id, item);
	return [...byId.values()];
}

/** The hazards of each step of making `version` as these lines. */
export function preparationHazards(version: Version, lines: PreparedLine[]): PreparationHazards {
	const stockCache = new Map<string, HazardSet>();
	const perLine: Record<string, HazardSet> = {};
	for (const line of lines) {
		if (line.kind === 'stock' && line.stockRecipeId) {
			if (!stockCache.has(line.stockRecipeId))
				stockCache.set(line.stockRecipeId, stockSolutionHazards(line.stockRecipeId));
			perLine[line.id] = stockCache.get(line.stockRecipeId)!;
		} else {
			const component = line.componentId ? findComponent(line.componentId) : undefined;
			perLine[line.id] = hazardSetOf(component?.ghsHazards ?? []);
		}
	}
	const ph = phStep(version);
	const finished = hazardSetOf(solutionStatements(version));
	const handled = [
		...Object.values(perLine),
		...(ph?.agents.map((a) => a.hazards) ?? []),
		finished
	];
	const hot =
		version.preparationTemperatureC > HOT_PREPARATION_C ||
		/autoclav|\bhot\b|\bwarm\b/i.test(version.instructions);
	return {
		lines: perLine,
		ph,
		finished,
		ppe: unionPpe(handled),
		fumeHood: lines
			.filter((l) => perLine[l.id].ppe.some((p) => p.id === 'fume-hood'))
			.map((l) => l.name),
		notices: hot
			? [
					{
						id: 'hot',
						text: 'Hot liquid: the medium is warmed or autoclaved. It can scald; let it cool before handling, and use heat-resistant gloves.'
					}
				]
			: []
	};
}
