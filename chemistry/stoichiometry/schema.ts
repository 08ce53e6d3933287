// The growth-stoichiometry request and result, as the API validates and documents them. Request
// shapes are strict objects at every level, union members included: a misspelt key is refused by name.
import { z } from 'zod';
import { describes } from '../schema-binding';
import type { StoichiometryResult } from './types';

const finite = z.number({ error: 'Give a number.' });
const speciesId = z.string().min(1).max(60);

const speciesRole = z.enum([
	'substrate',
	'nitrogen',
	'oxygen',
	'biomass',
	'carbonDioxide',
	'water',
	'product'
]);

const specification = z.discriminatedUnion('kind', [
	z.strictObject({
		kind: z.literal('rate'),
		species: speciesId,
		mol: finite,
		relativeError: finite.positive().optional()
	}),
	z.strictObject({
		kind: z.literal('massYield'),
		product: speciesId,
		substrate: speciesId,
		gPerG: finite,
		relativeError: finite.positive().optional()
	}),
	z.strictObject({
		kind: z.literal('molarRatio'),
		numerator: speciesId,
		denominator: speciesId,
		value: finite,
		relativeError: finite.positive().optional()
	})
]);

export const stoichiometryRequest = z.strictObject({
	species: z
		.array(
			z.strictObject({
				id: speciesId,
				formula: z.string().max(200),
				ashFraction: finite.min(0).max(0.5).optional(),
				role: speciesRole.optional()
			})
		)
		.min(2)
		.max(30),
	elements: z
		.array(z.string().regex(/^[A-Z][a-z]?$/, 'An element symbol such as C or Mg.'))
		.max(10)
		.optional(),
	specifications: z.array(specification).max(40),
	consistencyConfidence: finite.gt(0).lt(1).optional()
});

const nullableNumber = z.number().nullable();
const perSpecies = z.record(z.string(), z.number());
const specificationKind = z.enum(['rate', 'massYield', 'molarRatio']);

export const stoichiometryResponse = describes<StoichiometryResult>()(
	z.object({
		elements: z.array(z.string()).describe('the elements balanced'),
		rates: z
			.record(z.string(), z.object({ mol: z.number(), g: z.number(), cmol: z.number().nullable() }))
			.describe('per species: consumed negative, produced positive'),
		roles: z
			.record(z.string(), speciesRole.nullable())
			.describe(
				'as given, inferred from the formula or from the solved direction; null at zero rate'
			),
		molarMasses: perSpecies.describe('g/mol; biomass g per C-mol of dry weight, ash included'),
		yields: z.object({
			firstSubstrate: z.string().nullable(),
			biomassOnSubstrateGPerG: nullableNumber,
			biomassOnSubstrateCmolPerCmol: nullableNumber,
			perSubstrate: z.record(
				z.string(),
				z.object({
					biomassGPerG: nullableNumber,
					biomassCmolPerCmol: nullableNumber,
					productsGPerG: perSpecies
				})
			),
			biomassOnOxygenGPerG: nullableNumber,
			oxygenPerBiomassGPerG: nullableNumber,
			respiratoryQuotient: nullableNumber
		}),
		degreesOfReduction: perSpecies.describe(
			'per C-mol for carbon species, per mole otherwise (C +4, H +1, O −2, N −3, P +5, S +6)'
		),
		electronBalance: z.object({
			terms: perSpecies,
			sum: z.number(),
			relativeResidual: z.number(),
			closes: z.boolean(),
			availableFromSubstratesMol: z.number(),
			fractions: perSpecies
		}),
		elementResiduals: perSpecies.describe('E·r per element, mol'),
		degreesOfFreedom: z.int(),
		redundancy: z.int(),
		independentSpecifications: z.int(),
		consistency: z
			.object({
				redundancy: z.int(),
				chiSquare: z.number(),
				threshold: z.number(),
				confidence: z.number(),
				pValue: z.number(),
				consistent: z.boolean(),
				deviations: z.array(
					z.object({
						index: z.int(),
						kind: specificationKind,
						given: z.number(),
						fitted: z.number(),
						relativeDeviation: z.number(),
						relativeError: z.number()
					})
				)
			})
			.optional()
			.describe('the χ² test of the specifications; only when they are redundant'),
		notes: z.array(z.string())
	})
);
