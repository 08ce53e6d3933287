// The formula calculation's request and answer, as the API validates and documents them.
import { z } from 'zod';
import { describes } from './schema-binding';

/** What a formula calculation answers (built from parseFormula). */
export interface FormulaAnswer {
	formula: string;
	reading: string;
	molarMass: number;
	elements: Record<string, number>;
	parts: { formula: string; multiplier: number }[];
	dotRule: string;
}

export const formulaRequest = z.strictObject({ formula: z.string().max(500) });

export const formulaResponse = describes<FormulaAnswer>()(
	z.object({
		formula: z.string(),
		reading: z.string(),
		molarMass: z
			.number()
			.describe('g/mol, IUPAC 2021 standard atomic weights (conventional values)'),
		elements: z.record(z.string(), z.number()),
		parts: z.array(z.object({ formula: z.string(), multiplier: z.number() })),
		dotRule: z.string()
	})
);
