import { z } from 'zod';
import type { OxygenSaturationResult, StoichiometryResult, SufficiencyResult } from '$chemistry';
import {
	AIR_O2_MOLE_FRACTION,
	AIR_O2_MOLE_FRACTION_SOURCE,
	DEFAULT_ELEMENT_ROLES_BASIS,
	ELEMENT_ROLES,
	VALUE_CONFIDENCES
} from '$chemistry';
import type { ApiOperation } from '../openapi';
import { describes } from '../shapes';

/** What POST /api/v1/formula answers (its handler builds it from parseFormula). */
export interface FormulaAnswer {
	formula: string;
	reading: string;
	molarMass: number;
	elements: Record<string, number>;
	parts: { formula: string; multiplier: number }[];
	dotRule: string;
}

// Request shapes are strict objects at every level, union members included: a misspelt key is a 400
// naming it, never silently ignored.

const finite = z.number({ error: 'Give a number.' });
const speciesId = z.string().min(1).max(60);

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

const oxygenMethod = z.enum(['benson-krause-1984', 'garcia-gordon-1992']);

export const oxygenSaturationRequest = z.strictObject({
	temperatureC: finite,
	salinityGPerKg: finite.optional(),
	pressureKPa: finite.optional(),
	o2MoleFraction: finite
		.optional()
		.describe(`O2 mole fraction of the dry gas, 0–1; default air, ${AIR_O2_MOLE_FRACTION}`),
	method: oxygenMethod.optional()
});

const range = z.tuple([z.number(), z.number()]);

export const oxygenSaturationResponse = describes<OxygenSaturationResult>()(
	z.object({
		mgPerL: z.number(),
		mmolPerL: z.number(),
		umolPerKg: z.number().optional().describe('native Garcia–Gordon basis; only for that method'),
		airSaturationMgPerL: z
			.number()
			.describe(
				'C* for air at the same temperature, salinity and pressure (the 100 % of a DO probe)'
			),
		method: oxygenMethod,
		validRange: z
			.object({ temperatureC: range, salinityGPerKg: range, source: z.string() })
			.describe('where the method’s fit holds, [min, max]'),
		temperatureC: z.number(),
		salinityGPerKg: z.number(),
		pressureKPa: z.number(),
		o2MoleFraction: z.number(),
		waterVapourPressureKPa: z.number(),
		pressureFactor: z.number().describe('factor from 1 atm to pressureKPa (APHA/USGS)')
	})
);

const amounts = z.record(z.string().max(80), finite);

const confidence = z
	.enum(VALUE_CONFIDENCES)
	.describe(
		"How sure the value is: 'confirmed' (printed in the cited source), 'derived' (computed from confirmed inputs), 'from memory' (recalled, unchecked), 'measured' (your own analysis), 'unstated'"
	);
const role = z
	.enum(ELEMENT_ROLES)
	.describe(
		`'required': a shortfall sets the limit; 'trace': a shortfall is a warning. ${DEFAULT_ELEMENT_ROLES_BASIS}`
	);
const sourceText = z.string().max(400);

const elementStatements = z
	.record(
		z.string().regex(/^[A-Z][a-z]?$/, 'An element symbol such as Fe or Mg.'),
		z.strictObject({
			role: role.optional(),
			confidence: confidence.optional(),
			source: sourceText.optional()
		})
	)
	.describe(
		"Per element of the profile: a role that overrides the default, how sure its value is, and where it comes from. A preset's own confidence and source apply where none is given."
	);

const yieldStanding = {
	confidence: confidence.optional(),
	source: sourceText.optional().describe('Where the yield comes from')
};

export const sufficiencyRequest = z.strictObject({
	profile: z.discriminatedUnion('kind', [
		z.strictObject({
			kind: z.literal('preset'),
			id: z.string(),
			elements: elementStatements.optional()
		}),
		z.strictObject({
			kind: z.literal('elementalFractions'),
			name: z.string().optional(),
			fractions: amounts,
			cellDryMassPg: finite.optional(),
			elements: elementStatements.optional(),
			formula: z
				.string()
				.max(200)
				.optional()
				.describe(
					'Ash-free biomass formula per C-mol; when given, each fraction of its elements is checked against it (a warning beyond 1 percentage point)'
				),
			ashFraction: finite
				.optional()
				.describe('g ash per g dry biomass, for the check against the formula')
		}),
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
			elements: elementStatements.optional(),
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
			z.strictObject({
				basis: z.literal('component'),
				component: z.string(),
				yieldGPerG: finite,
				...yieldStanding
			}),
			z.strictObject({ basis: z.literal('element'), yieldGPerGCarbon: finite, ...yieldStanding })
		])
		.optional(),
	ignoreElements: z.array(z.string()).optional()
});

/** One line of a sufficiency assessment; the study report's nutrient lines carry the same fields. */
export const sufficiencyLineResponse = z.object({
	key: z.string().describe('Element symbol or component id'),
	basis: z.enum(['element', 'component']),
	demandGPerL: z.number(),
	supplyGPerL: z.number(),
	demandMmolPerL: z.number().nullable(),
	supplyMmolPerL: z.number().nullable(),
	ratio: z.number().describe('supply / demand'),
	marginGPerL: z.number().describe('supply − safety factor × demand'),
	sufficient: z.boolean(),
	maxBiomassGPerL: z.number().nullable(),
	maxCellsPerMl: z.number().nullable(),
	role: role,
	roleFrom: z
		.enum(['default', 'profile'])
		.describe(
			"'default': the table of default roles (common practice), or the rule that the carbon source, substrates and component demands are required; 'profile': the profile's own statement"
		),
	confidence: confidence.describe('How sure the composition value (or yield) behind the demand is'),
	source: z
		.string()
		.nullable()
		.describe('Where that value comes from: the published table, the analysis, the yield method'),
	note: z.string().optional()
});

export const sufficiencyResponse = describes<SufficiencyResult>()(
	z.object({
		target: z.object({
			biomassGPerL: z.number().nullable(),
			cellsPerMl: z.number().nullable(),
			cellDryMassPg: z.number().nullable()
		}),
		safetyFactor: z.number(),
		finalVolumeL: z.number().nullable(),
		lines: z.array(sufficiencyLineResponse),
		limiting: z
			.object({ key: z.string(), basis: z.enum(['element', 'component']), ratio: z.number() })
			.nullable()
			.describe('The required line of lowest ratio; trace lines never limit'),
		maximumSupportable: z
			.object({ biomassGPerL: z.number().nullable(), cellsPerMl: z.number().nullable() })
			.describe('From the limiting required line: target × ratio / safety factor'),
		sufficient: z.boolean().describe('Every required line has supply ≥ safety factor × demand'),
		warnings: z
			.array(z.string())
			.describe(
				'Trace elements short of safety factor × demand, each by name; fractions that contradict the formula'
			),
		notes: z.array(z.string()),
		defaultRolesBasis: z.string().describe('Where the default roles come from')
	})
);

export const chemistryOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/formula',
		summary:
			'Parses a chemical formula (hydrates, decimal subscripts) and gives its molar mass and element counts',
		act: 'calculation.run',
		request: formulaRequest,
		response: formulaResponse
	},
	{
		method: 'post',
		path: '/api/v1/stoichiometry',
		summary:
			'Solves a black-box growth balance by element balances (C, H, O, N; P, S optional). Consumed rates are negative, produced positive; a molarRatio is |numerator|/|denominator|; biomass grams include ash',
		act: 'calculation.run',
		request: stoichiometryRequest,
		response: stoichiometryResponse
	},
	{
		method: 'post',
		path: '/api/v1/oxygen/saturation',
		summary: `Dissolved-oxygen saturation: Benson & Krause (1984) as given in APHA Standard Methods 4500-O by default, or Garcia & Gordon (1992). Defaults: salinity 0 g/kg, 101.325 kPa, o2MoleFraction ${AIR_O2_MOLE_FRACTION} (dry air; ${AIR_O2_MOLE_FRACTION_SOURCE})`,
		act: 'calculation.run',
		request: oxygenSaturationRequest,
		response: oxygenSaturationResponse
	},
	{
		method: 'post',
		path: '/api/v1/sufficiency',
		summary:
			'Demand, supply, ratio and margin per element or component for a target biomass; names the limiting required nutrient and the maximum supportable biomass after the safety factor (default 1.2, common practice). Each line carries its role (required, or trace: a short trace element is a warning, never the limit), how sure its value is and its source',
		act: 'calculation.run',
		request: sufficiencyRequest,
		response: sufficiencyResponse
	}
];
