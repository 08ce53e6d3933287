import {
	ATOMIC_WEIGHTS,
	balanceCarbonYield,
	computeMaximumBiomassYield,
	computeSoleSourceYield,
	type SubstrateYieldEntry,
	type YieldFields
} from '$chemistry';
import { readDecimalText } from '$lib/number-reading';
import { findComponent } from '../components/library';
import { RuleError, withRuleErrors } from '../rule-error';

// The element balances behind these yields are chemistry/study/profile-yields.ts; here the library is looked up.
export type { YieldFields };

function formulaOf(componentId: string, field: string): string {
	const component = findComponent(componentId);
	if (!component)
		throw new RuleError(
			`No component “${componentId}” in the library (use its id, e.g. l-glutamine).`,
			{ field }
		);
	if (!component.formula)
		throw new RuleError(
			`${component.name} has no formula, so no element balance can be made with it; enter its yield instead.`,
			{ field }
		);
	return component.formula;
}

/** Yx/s as stored: typed in, or worked out on save with the carbon source's formula from the library. */
export function resolveCarbonYield(f: YieldFields): number | null {
	if (f.yieldXSMethod === 'entered') {
		checkYieldWithinBalance(f);
		return f.yieldXSGPerG;
	}
	if (!f.carbonSourceId)
		throw new RuleError(
			'Choose the carbon source: its formula is needed for the element balance.',
			{ field: 'carbonSourceId' }
		);
	const formula = formulaOf(f.carbonSourceId, 'carbonSourceId');
	return withRuleErrors(() => balanceCarbonYield(f, formula)).yieldGPerG;
}

/**
 * A typed Yx/s above what the element balances allow on the carbon source is refused with the
 * bound and its reason (usually a unit slip: g/g against mol/mol or C-mol/C-mol).
 */
function checkYieldWithinBalance(f: YieldFields): void {
	if (f.yieldXSGPerG === null || !f.carbonSourceId || !f.biomassFormula) return;
	const component = findComponent(f.carbonSourceId);
	if (!component?.formula) return;
	const bound = withRuleErrors(
		() =>
			computeMaximumBiomassYield({
				substrateFormula: component.formula!,
				biomassFormula: f.biomassFormula!,
				ashFraction: f.ashFraction ?? 0
			}),
		{ field: 'yieldXSGPerG' }
	);
	if (bound && f.yieldXSGPerG > bound.maxGPerG * (1 + 1e-9))
		throw new RuleError(
			`Yx/s ${f.yieldXSGPerG} g/g is more than the element balances allow on ${component.name}: at most ${bound.maxGPerG.toPrecision(3)} g/g, because ${bound.reason}. Check the units: g dry biomass per g ${component.name}.`,
			{ field: 'yieldXSGPerG' }
		);
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
				throw new RuleError(
					`Line ${i + 1} (“${entry}”) should be a component id and a yield in g/g (“l-glutamine 0.9”), or “from” and the element it alone supplies (“ammonium-sulfate from N”).`,
					{ field }
				);
			}
			const [, componentId, element, number] = m;
			const component = findComponent(componentId);
			if (!component)
				throw new RuleError(
					`No component “${componentId}” in the library (use its id, e.g. l-glutamine).`,
					{ field }
				);
			if (componentId === f.carbonSourceId)
				throw new RuleError(
					`${component.name} is the carbon source: its yield is Yx/s above, not a further substrate.`,
					{ field }
				);
			if (seen.has(componentId))
				throw new RuleError(`${component.name} is listed twice.`, { field });
			if (perCell.has(componentId))
				throw new RuleError(
					`${component.name} has both a per-cell consumption rate and a yield; keep one of them.`,
					{ field }
				);
			seen.add(componentId);
			if (number !== undefined) {
				const read = readDecimalText(number, 'Yield');
				const yieldGPerG = read.ok ? read.value : NaN;
				if (!Number.isFinite(yieldGPerG) || yieldGPerG <= 0 || yieldGPerG > 1000) {
					throw new RuleError(
						`The yield on ${component.name} must be a number above 0 and at most 1000 g/g, not “${number}”.`,
						{ field }
					);
				}
				return { componentId, method: 'entered', yieldGPerG };
			}
			if (!(element in ATOMIC_WEIGHTS))
				throw new RuleError(`“${element}” is not an element symbol.`, { field });
			const substrateFormula = formulaOf(componentId, field);
			const fraction = f.elementalFractions?.[element];
			const yieldGPerG = withRuleErrors(
				() =>
					computeSoleSourceYield(
						fraction !== undefined && fraction > 0
							? { substrateFormula, element, biomassElementFraction: fraction }
							: {
									substrateFormula,
									element,
									biomassFormula: f.biomassFormula ?? undefined,
									ashFraction: f.ashFraction ?? 0
								}
					),
				{ field }
			);
			return {
				componentId,
				method: 'soleSource',
				element,
				yieldGPerG: Number(yieldGPerG.toPrecision(4))
			};
		});
}

export function formatSubstrateYields(list: SubstrateYieldEntry[]): string {
	return list
		.map((y) =>
			y.method === 'soleSource'
				? `${y.componentId} from ${y.element}`
				: `${y.componentId} ${y.yieldGPerG}`
		)
		.join('\n');
}
