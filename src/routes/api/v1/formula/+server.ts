import {
	DOT_RULE,
	molarMassOf,
	parseFormula,
	formulaRequest,
	type FormulaAnswer
} from '$chemistry';
import { endpoint } from '$lib/server/api/endpoint';

export const POST = endpoint({ act: 'calculation.run', body: formulaRequest }, ({ body }) => {
	const parsed = parseFormula(body.formula);
	return {
		formula: parsed.text,
		reading: parsed.reading,
		molarMass: molarMassOf(parsed.elements),
		elements: parsed.elements,
		parts: parsed.parts,
		dotRule: DOT_RULE
	} satisfies FormulaAnswer;
});
