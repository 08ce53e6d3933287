import { z } from 'zod';
import { AIR_O2_MOLE_FRACTION, AIR_O2_MOLE_FRACTION_SOURCE } from '$chemistry';
import type { ApiOperation } from '../openapi';

// Request shapes are strict objects at every level, union members included: a misspelt key is a 400
// naming it, never silently ignored.

const finite = z.number({ error: 'Give a number.' });
const speciesId = z.string().min(1).max(60);

export const formulaRequest = z.strictObject({ formula: z.string().max(500) });

export const formulaResponse = z.object({
	formula: z.string(),
	reading: z.string(),
	molarMass: z.number().describe('g/mol, IUPAC 2021 standard atomic weights (conventional values)'),
	elements: z.record(z.string(), z.number()),
	parts: z.array(z.object({ formula: z.string(), multiplier: z.number() })),
	dotRule: z.string()
});

const specification = z.discriminatedUnion('kind', [
	z.strictObject({ kind: z.literal('rate'), species: speciesId, mol: finite, relativeError: finite.positive().optional() }),
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
				role: z.enum(['substrate', 'nitrogen', 'oxygen', 'biomass', 'carbonDioxide', 'water', 'product']).optional()
			})
		)
		.min(2)
		.max(30),
	elements: z.array(z.string().regex(/^[A-Z][a-z]?$/, 'An element symbol such as C or Mg.')).max(10).optional(),
	specifications: z.array(specification).max(40),
	consistencyConfidence: finite.gt(0).lt(1).optional()
});

export const oxygenSaturationRequest = z.strictObject({
	temperatureC: finite,
	salinityGPerKg: finite.optional(),
	pressureKPa: finite.optional(),
	o2MoleFraction: finite
		.optional()
		.describe(`O2 mole fraction of the dry gas, 0–1; default air, ${AIR_O2_MOLE_FRACTION}`),
	method: z.enum(['benson-krause-1984', 'garcia-gordon-1992']).optional()
});

export const oxygenSaturationResponse = z.object({
	mgPerL: z.number(),
	mmolPerL: z.number(),
	airSaturationMgPerL: z.number(),
	method: z.string(),
	validRange: z.object({ temperatureMinC: z.number(), temperatureMaxC: z.number() }).loose(),
	temperatureC: z.number(),
	salinityGPerKg: z.number(),
	pressureKPa: z.number(),
	o2MoleFraction: z.number()
});

const amounts = z.record(z.string().max(80), finite);

export const sufficiencyRequest = z.strictObject({
	profile: z.discriminatedUnion('kind', [
		z.strictObject({ kind: z.literal('preset'), id: z.string() }),
		z.strictObject({ kind: z.literal('elementalFractions'), name: z.string().optional(), fractions: amounts, cellDryMassPg: finite.optional() }),
		z.strictObject({
			kind: z.literal('componentRequirements'),
			name: z.string().optional(),
			requirementsGPerG: amounts,
			cellDryMassPg: finite.optional()
		}),
		z.strictObject({
			kind: z.literal('perCell'),
			name: z.string().optional(),
			cellDryMassPg: finite.optional(),
			consumption: z
				.array(
					z.strictObject({
						key: z.string().min(1),
						basis: z.enum(['element', 'component']),
						pgPerCell: finite.optional(),
						mmolPer1e9Cells: finite.optional(),
						molarMassGPerMol: finite.optional(),
						formula: z.string().optional()
					})
				)
				.min(1)
		})
	]),
	target: z.union([
		z.strictObject({ biomassGPerL: finite }),
		z.strictObject({ cellsPerMl: finite, cellDryMassPg: finite.optional() })
	]),
	supply: z.strictObject({
		finalVolumeL: finite.optional(),
		sources: z
			.array(
				z.strictObject({
					name: z.string().optional(),
					volumeL: finite.optional(),
					elementsGPerL: amounts.optional(),
					componentsGPerL: amounts.optional(),
					elementsG: amounts.optional(),
					componentsG: amounts.optional()
				})
			)
			.min(1)
			.max(50)
	}),
	safetyFactor: finite.optional(),
	carbon: z
		.discriminatedUnion('basis', [
			z.strictObject({ basis: z.literal('component'), component: z.string(), yieldGPerG: finite }),
			z.strictObject({ basis: z.literal('element'), yieldGPerGCarbon: finite })
		])
		.optional(),
	ignoreElements: z.array(z.string()).optional()
});

export const chemistryOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/formula',
		summary: 'Parses a chemical formula (hydrates, decimal subscripts) and gives its molar mass and element counts',
		access: 'signed-in',
		request: formulaRequest,
		response: formulaResponse
	},
	{
		method: 'post',
		path: '/api/v1/stoichiometry',
		summary:
			'Solves a black-box growth balance by element balances (C, H, O, N; P, S optional). Consumed rates are negative, produced positive; a molarRatio is |numerator|/|denominator|; biomass grams include ash',
		access: 'signed-in',
		request: stoichiometryRequest
	},
	{
		method: 'post',
		path: '/api/v1/oxygen/saturation',
		summary:
			`Dissolved-oxygen saturation: Benson & Krause (1984) as given in APHA Standard Methods 4500-O by default, or Garcia & Gordon (1992). Defaults: salinity 0 g/kg, 101.325 kPa, o2MoleFraction ${AIR_O2_MOLE_FRACTION} (dry air; ${AIR_O2_MOLE_FRACTION_SOURCE})`,
		access: 'signed-in',
		request: oxygenSaturationRequest,
		response: oxygenSaturationResponse
	},
	{
		method: 'post',
		path: '/api/v1/sufficiency',
		summary:
			'Demand, supply, ratio and margin per element or component for a target biomass; names the limiting nutrient and the maximum supportable biomass after the safety factor (default 1.2, common practice)',
		access: 'signed-in',
		request: sufficiencyRequest
	}
];
