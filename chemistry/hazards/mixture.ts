/**
 * The hazard statements a solution carries at the concentrations of its ingredients, by the
 * UN GHS (Rev. 10) rules for mixtures classified from their ingredients (generic concentration
 * limits, additivity and summation). The rules and their simplifications are in
 * health-rules.ts, acute-toxicity.ts, reproductive.ts, aquatic.ts and physical-rules.ts.
 *
 * What is not in an ingredient list (the water) is taken as not hazardous. A statement this
 * library does not classify by concentration (EUH codes, physical hazards other than H272 and
 * H290, codes it does not know) is carried over from every ingredient that has it.
 */
import type { GhsHazard } from '../components';
import { ACUTE_TOXICITY_CODES, classifyAcuteToxicity, type InhalationForm } from './acute-toxicity';
import { AQUATIC_CODES, aquaticFindings } from './aquatic';
import {
	HAZARD_CLASSES,
	hazardStatementInfo,
	labelElementsOf,
	splitHazardCode,
	type HazardClassId,
	type HazardGroup,
	type LabelElements,
	type PictogramId,
	type SignalWord
} from './classes';
import {
	INGREDIENT_LIMIT_CODES,
	additiveSingleExposureFindings,
	aspirationFindings,
	extremePhFindings,
	eyeFindings,
	ingredientLimitFindings,
	sensitiserFindings,
	skinFindings
} from './health-rules';
import { PHYSICAL_RULE_CODES, physicalFindings } from './physical-rules';
import { REPRODUCTIVE_CODES, reproductiveFindings } from './reproductive';
import {
	finding,
	type AcuteToxicityEstimates,
	type Finding,
	type RuleIngredient
} from './rule-types';
import { checkIngredients } from './mixture-input';

export type { AcuteToxicityEstimates } from './rule-types';
export type { InhalationForm } from './acute-toxicity';

export interface SolutionIngredient {
	name: string;
	/** g of this ingredient per g of solution, 0..1. */
	massFraction: number;
	hazards: GhsHazard[];
	/** Its own acute toxicity estimates, when its data sheet gives them; else read from its statements. */
	acuteToxicityEstimates?: AcuteToxicityEstimates;
}

export interface ClassifySolutionOptions {
	/** Water is the solvent (default true): governs the H272 rule. */
	aqueous?: boolean;
	/** The solution's pH, when known: ≤ 2 or ≥ 11.5 makes it corrosive to skin and eyes. */
	pH?: number;
	/** The form the acute inhalation estimates refer to (default 'dust-mist'). */
	inhalationForm?: InhalationForm;
}

export interface SolutionHazard {
	code: string;
	text: string;
	/** Null for a statement this library does not know. */
	hazardClass: HazardClassId | null;
	category: string | null;
	pictograms: PictogramId[];
	signalWord: SignalWord | null;
	/** The ingredients that carry it at these concentrations. */
	ingredients: string[];
	/** Aquatic and ozone hazards: for disposal, shown apart from the cautions at the bench. */
	environmental: boolean;
	/** The rule that gave it, with its section of the standard. */
	basis: string;
	/** Given by a rule of the trade, not by the standard. */
	commonPractice: boolean;
}

/** A sensitiser present at 0.1–1 %: not a hazard statement of the solution, but worth telling. */
export interface SolutionNotice {
	code: 'H317' | 'H334';
	text: string;
	ingredients: string[];
	basis: string;
}

export interface SolutionClassification {
	hazards: SolutionHazard[];
	notices: SolutionNotice[];
	/** ATEmix per route (null: no acutely toxic ingredient on that route). */
	acuteToxicityEstimates: {
		oralMgPerKg: number | null;
		dermalMgPerKg: number | null;
		inhalation: number | null;
		inhalationUnit: 'ppmV' | 'mg/L';
	};
	/** Pictograms and signal word for every statement, after the GHS precedence rules. */
	label: LabelElements;
}

const SENSITISED_NOTICE = 'May cause a reaction in sensitised people';

const CLASSIFIED_CODES: ReadonlySet<string> = new Set([
	...ACUTE_TOXICITY_CODES,
	...AQUATIC_CODES,
	...INGREDIENT_LIMIT_CODES,
	...PHYSICAL_RULE_CODES,
	...REPRODUCTIVE_CODES,
	...['H304', 'H305', 'H314', 'H315', 'H316', 'H317', 'H318', 'H319', 'H320', 'H334'],
	...['H335', 'H336']
]);

export function classifySolution(
	ingredients: readonly SolutionIngredient[],
	options: ClassifySolutionOptions = {}
): SolutionClassification {
	const rule = toRuleIngredients(ingredients, options);
	const acute = classifyAcuteToxicity(rule, options.inhalationForm ?? 'dust-mist');
	const sensitisers = sensitiserFindings(rule);
	const findings: Finding[] = [
		...physicalFindings(rule, options.aqueous ?? true),
		...carriedOver(rule),
		...acute.findings,
		...skinFindings(rule),
		...eyeFindings(rule),
		...(options.pH === undefined ? [] : extremePhFindings(rule, options.pH)),
		...sensitisers.findings,
		...reproductiveFindings(rule),
		...ingredientLimitFindings(rule),
		...additiveSingleExposureFindings(rule),
		...aspirationFindings(rule),
		...aquaticFindings(rule)
	];
	const hazards = withPrecedence(mergeByCode(findings)).map((f) =>
		describe(f, textsOf(ingredients))
	);
	hazards.sort(byGroupThenCode);
	const notices = sensitisers.notices
		.filter((n) => !hazards.some((h) => h.code === n.code))
		.map((n) => ({ ...n, text: SENSITISED_NOTICE }));
	return {
		hazards,
		notices,
		acuteToxicityEstimates: {
			oralMgPerKg: acute.oralMgPerKg,
			dermalMgPerKg: acute.dermalMgPerKg,
			inhalation: acute.inhalation,
			inhalationUnit: acute.inhalationUnit
		},
		label: labelElementsOf(hazards.map((h) => h.code))
	};
}

function toRuleIngredients(
	ingredients: readonly SolutionIngredient[],
	options: ClassifySolutionOptions
): RuleIngredient[] {
	checkIngredients(ingredients, options);
	return ingredients.map((ingredient) => ({
		name: ingredient.name.trim(),
		percent: ingredient.massFraction * 100,
		codes: new Set(ingredient.hazards.flatMap((h) => splitHazardCode(h.code))),
		acuteToxicityEstimates: ingredient.acuteToxicityEstimates
	}));
}

function carriedOver(ingredients: readonly RuleIngredient[]): Finding[] {
	const findings: Finding[] = [];
	for (const ingredient of ingredients) {
		if (ingredient.percent === 0) continue;
		for (const code of ingredient.codes) {
			if (CLASSIFIED_CODES.has(code)) continue;
			const known = hazardStatementInfo(code) !== undefined;
			const basis = known
				? 'physical hazards are decided by testing (UN GHS Rev. 10, chapter 2): carried over'
				: 'not a statement classified here by concentration: carried over';
			findings.push(finding(code, [ingredient], basis));
		}
	}
	return findings;
}

function mergeByCode(findings: readonly Finding[]): Finding[] {
	const byCode = new Map<string, Finding>();
	for (const f of findings) {
		const seen = byCode.get(f.code);
		if (!seen) byCode.set(f.code, { ...f, ingredients: [...f.ingredients] });
		else {
			seen.ingredients = [...new Set([...seen.ingredients, ...f.ingredients])];
			if (!seen.basis.includes(f.basis)) seen.basis = `${seen.basis}; ${f.basis}`;
			if (!f.commonPractice) delete seen.commonPractice;
		}
	}
	return [...byCode.values()];
}

/** Within a ladder only the most severe statement found stays (first listed is most severe). */
const LADDERS: readonly (readonly string[])[] = [
	['H314', 'H315', 'H316'],
	['H318', 'H319', 'H320'],
	['H304', 'H305']
];

/**
 * UN GHS Rev. 10, 1.4.10.5.3.3: H318 may be left out beside H314, H400 beside H410, H401
 * beside H411, H402 beside H412. We leave them out, so a corrosive reads as one statement.
 */
const OMITTED_BESIDE: Readonly<Record<string, string>> = {
	H318: 'H314',
	H400: 'H410',
	H401: 'H411',
	H402: 'H412'
};

function withPrecedence(findings: readonly Finding[]): Finding[] {
	const codes = new Set(findings.map((f) => f.code));
	return findings.filter((f) => {
		const ladder = LADDERS.find((l) => l.includes(f.code));
		if (ladder && ladder.slice(0, ladder.indexOf(f.code)).some((c) => codes.has(c))) return false;
		const over = OMITTED_BESIDE[f.code];
		return !(over && codes.has(over));
	});
}

function textsOf(ingredients: readonly SolutionIngredient[]): Map<string, string> {
	const texts = new Map<string, string>();
	for (const ingredient of ingredients) {
		for (const hazard of ingredient.hazards) {
			for (const code of splitHazardCode(hazard.code)) texts.set(code, hazard.text);
		}
	}
	return texts;
}

function describe(f: Finding, ingredientTexts: ReadonlyMap<string, string>): SolutionHazard {
	const info = hazardStatementInfo(f.code);
	const group: HazardGroup | null = info ? HAZARD_CLASSES[info.hazardClass].group : null;
	return {
		code: f.code,
		text: info?.text ?? ingredientTexts.get(f.code) ?? f.code,
		hazardClass: info?.hazardClass ?? null,
		category: info?.category ?? null,
		pictograms: info?.pictograms ?? [],
		signalWord: info?.signalWord ?? null,
		ingredients: f.ingredients,
		environmental: group === 'environmental',
		basis: f.basis,
		commonPractice: f.commonPractice ?? false
	};
}

const GROUP_ORDER: readonly (HazardGroup | 'unknown')[] = [
	'physical',
	'health',
	'environmental',
	'unknown'
];

function byGroupThenCode(a: SolutionHazard, b: SolutionHazard): number {
	const group = (h: SolutionHazard) =>
		GROUP_ORDER.indexOf(h.hazardClass ? HAZARD_CLASSES[h.hazardClass].group : 'unknown');
	return group(a) - group(b) || a.code.localeCompare(b.code, 'en', { numeric: true });
}
