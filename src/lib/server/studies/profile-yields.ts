import { readDecimalText } from '$lib/quantities';
import { ATOMIC_WEIGHTS, O2_MOLAR_MASS_G_PER_MOL, computeSoleSourceYield, solveAerobicGrowth, type PerCellConsumption } from '$chemistry';
import type { SubstrateYieldEntry, YieldMethod } from '$lib/studies';
import { findComponent } from '../components/library';
import { RuleError, withRuleErrors } from '../rule-error';

/** What the yield rules read from the profile form, already checked field by field. */
export interface YieldFields {
	kind: string;
	biomassFormula: string | null;
	ashFraction: number | null;
	elementalFractions: Record<string, number> | null;
	perCellConsumption: PerCellConsumption[] | null;
	carbonSourceId: string | null;
	yieldXSMethod: YieldMethod;
	yieldXSGPerG: number | null;
	respiratoryQuotient: number | null;
	muMaxPerH: number | null;
	yieldXO2GPerG: number | null;
	qO2MmolPerGH: number | null;
}

function formulaOf(componentId: string, field: string): string {
	const component = findComponent(componentId);
	if (!component) throw new RuleError(`No component “${componentId}” in the library (use its id, e.g. l-glutamine).`, { field });
	if (!component.formula) throw new RuleError(`${component.name} has no formula, so no element balance can be made with it; enter its yield instead.`, { field });
	return component.formula;
}

export interface BalancedCarbonYield {
	yieldGPerG: number;
	/** % change of Yx/s per 1 % error in the measured value. */
	elasticity: number;
	/** The measurement, in words, e.g. "RQ 1.05". */
	from: string;
}

/**
 * Yx/s on the carbon source (of formula `substrateFormula`) from the C/H/O/N balance of growth on it
 * with NH3 and one measured quantity: the RQ, or the yield on O2 (qO2 stands for Yx/O2 = μmax/qO2 at μmax).
 */
export function balanceCarbonYield(f: YieldFields, substrateFormula: string): BalancedCarbonYield {
	if (!f.biomassFormula) throw new RuleError('Enter the biomass formula: the element balance that gives Yx/s needs it.', { field: 'biomassFormula' });
	let measured: Parameters<typeof solveAerobicGrowth>[0]['measured'];
	let from: string;
	if (f.yieldXSMethod === 'respiratoryQuotient') {
		if (f.respiratoryQuotient === null) throw new RuleError('Enter the measured RQ (mol CO2 per mol O2) to work out Yx/s from it.', { field: 'respiratoryQuotient' });
		measured = { kind: 'respiratoryQuotient', molCo2PerMolO2: f.respiratoryQuotient };
		from = `RQ ${f.respiratoryQuotient}`;
	} else if (f.yieldXO2GPerG !== null) {
		measured = { kind: 'oxygenYield', gBiomassPerGO2: f.yieldXO2GPerG };
		from = `Yx/O2 ${f.yieldXO2GPerG} g/g`;
	} else if (f.qO2MmolPerGH !== null && f.muMaxPerH !== null) {
		measured = { kind: 'oxygenYield', gBiomassPerGO2: f.muMaxPerH / ((f.qO2MmolPerGH * O2_MOLAR_MASS_G_PER_MOL) / 1000) };
		from = `qO2 ${f.qO2MmolPerGH} mmol/(g·h) at μmax ${f.muMaxPerH} /h`;
	} else {
		throw new RuleError('Enter Yx/O2, or qO2 with μmax, to work out Yx/s from the oxygen yield.', { field: 'yieldXO2GPerG' });
	}
	const solved = withRuleErrors(() => solveAerobicGrowth({ substrateFormula, biomassFormula: f.biomassFormula!, ashFraction: f.ashFraction ?? 0, measured }), {
		field: 'yieldXSMethod'
	});
	return { yieldGPerG: Number(solved.biomassOnSubstrateGPerG.toPrecision(4)), elasticity: solved.yieldElasticity, from };
}

/** Yx/s as stored: typed in, or worked out on save with the carbon source's formula from the library. */
export function resolveCarbonYield(f: YieldFields): number | null {
	if (f.yieldXSMethod === 'entered') return f.yieldXSGPerG;
	if (!f.carbonSourceId) throw new RuleError('Choose the carbon source: its formula is needed for the element balance.', { field: 'carbonSourceId' });
	return balanceCarbonYield(f, formulaOf(f.carbonSourceId, 'carbonSourceId')).yieldGPerG;
}

/**
 * Where Yx/s on the carbon source came from, in one line for the profile page and the report. The
 * formula comes with the caller's loaded data, so a study's evaluation reads no database.
 */
export function describeCarbonYield(f: YieldFields, carbonSourceFormula: string | null): string {
	if (f.yieldXSMethod === 'entered') return 'Entered on the profile';
	try {
		if (!carbonSourceFormula) throw new RuleError('the carbon source has no formula in the library.');
		const b = balanceCarbonYield(f, carbonSourceFormula);
		const sensitivity = Number.isFinite(b.elasticity) ? `; a 1 % error in it moves Yx/s by about ${Math.abs(b.elasticity).toPrecision(2)} %` : '; the value sits at the edge of what the balance allows';
		return `Element balance (C, H, O, N; NH3 as N source) from ${b.from}${sensitivity}`;
	} catch (cause) {
		if (cause instanceof RuleError) return `Element balance, which now fails: ${cause.message}`;
		throw cause;
	}
}

/** "l-glutamine 0.9" (entered, g/g) or "ammonium-sulfate from N" (sole source of N), one per line. */
export function parseSubstrateYields(text: string, f: YieldFields): SubstrateYieldEntry[] {
	const field = 'substrateYields';
	const seen = new Set<string>();
	const perCell = new Set((f.perCellConsumption ?? []).map((c) => c.key));
	return text
		.split('\n')
		.map((l) => l.trim())
		.filter(Boolean)
		.map((entry, i): SubstrateYieldEntry => {
			const m = /^(\S+)\s+(?:from\s+([A-Z][a-z]?)|([\d.,eE+-]+))$/.exec(entry);
			if (!m) {
				throw new RuleError(`Line ${i + 1} (“${entry}”) should be a component id and a yield in g/g (“l-glutamine 0.9”), or “from” and the element it alone supplies (“ammonium-sulfate from N”).`, { field });
			}
			const [, componentId, element, number] = m;
			const component = findComponent(componentId);
			if (!component) throw new RuleError(`No component “${componentId}” in the library (use its id, e.g. l-glutamine).`, { field });
			if (componentId === f.carbonSourceId) throw new RuleError(`${component.name} is the carbon source: its yield is Yx/s above, not a further substrate.`, { field });
			if (seen.has(componentId)) throw new RuleError(`${component.name} is listed twice.`, { field });
			if (perCell.has(componentId)) throw new RuleError(`${component.name} has both a per-cell consumption rate and a yield; keep one of them.`, { field });
			seen.add(componentId);
			if (number !== undefined) {
				const read = readDecimalText(number, 'Yield');
				const yieldGPerG = read.ok ? read.value : NaN;
				if (!Number.isFinite(yieldGPerG) || yieldGPerG <= 0 || yieldGPerG > 1000) {
					throw new RuleError(`The yield on ${component.name} must be a number above 0 and at most 1000 g/g, not “${number}”.`, { field });
				}
				return { componentId, method: 'entered', yieldGPerG };
			}
			if (!(element in ATOMIC_WEIGHTS)) throw new RuleError(`“${element}” is not an element symbol.`, { field });
			const substrateFormula = formulaOf(componentId, field);
			const fraction = f.elementalFractions?.[element];
			const yieldGPerG = withRuleErrors(
				() =>
					computeSoleSourceYield(
						fraction !== undefined && fraction > 0
							? { substrateFormula, element, biomassElementFraction: fraction }
							: { substrateFormula, element, biomassFormula: f.biomassFormula ?? undefined, ashFraction: f.ashFraction ?? 0 }
					),
				{ field }
			);
			return { componentId, method: 'soleSource', element, yieldGPerG: Number(yieldGPerG.toPrecision(4)) };
		});
}

export function formatSubstrateYields(list: SubstrateYieldEntry[]): string {
	return list.map((y) => (y.method === 'soleSource' ? `${y.componentId} from ${y.element}` : `${y.componentId} ${y.yieldGPerG}`)).join('\n');
}

/** One line saying where a yield came from, for the profile page and the study report. */
export function describeSubstrateYield(y: SubstrateYieldEntry): string {
	return y.method === 'soleSource'
		? `Element balance: the only source of ${y.element}, Yx/s = w_${y.element}(substrate) / w_${y.element}(biomass)`
		: 'Entered on the profile';
}
