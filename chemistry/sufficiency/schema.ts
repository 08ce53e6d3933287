// The sufficiency request and result, as the API validates and documents them; the study report's
// nutrient lines carry the same fields as a line here. Request shapes are strict objects at every level.
import { z } from 'zod';
import { DEFAULT_ELEMENT_ROLES_BASIS, ELEMENT_ROLES } from '../data/element-roles';
import { VALUE_CONFIDENCES } from '../profile-elements';
import { describes } from '../schema-binding';
import type { SufficiencyResult } from './types';

const finite = z.number({ error: 'Give a number.' });

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
