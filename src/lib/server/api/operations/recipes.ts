import type { PreviewAnalysis } from '../../recipes/preview';
import { z } from 'zod';
import { COMPONENT_CATEGORIES, LINE_KINDS, RECIPE_KINDS, VERSION_STATUSES } from '$lib/recipes';
import { COMPONENT_SORTS } from '../../components/component-list';
import type { Component } from '../../db/schema';
import { pagingFields } from '../../list-paging';
import type { RecipeAnalysis } from '../../recipes/analysis';
import type { RecipeSummary } from '../../recipes/queries';
import type { recipeView, versionView } from '../../recipes/view';
import type { ApiOperation } from '../openapi';
import { describes, isoTime, signatureResponse } from '../shapes';

const numberOrText = z.union([z.number(), z.string().max(40)]);

// Strict at every level: a misspelt key is a 400 naming it, never silently ignored.
export const previewRequest = z.strictObject({
	recipeId: z
		.string()
		.max(80)
		.optional()
		.describe('The recipe being edited, so a stock cannot contain it'),
	preparationTemperatureC: numberOrText.optional().describe('°C; 25 when omitted'),
	osmolalityMinMOsmPerKg: numberOrText.optional(),
	osmolalityMaxMOsmPerKg: numberOrText.optional(),
	lines: z
		.array(
			z.strictObject({
				kind: z.enum(LINE_KINDS).default('component'),
				componentId: z.string().max(80).optional(),
				shelfFormId: z.string().max(80).optional(),
				stockRecipeId: z.string().max(80).optional(),
				amount: numberOrText.describe('Concentration in the finished medium; mL per L for a stock'),
				unit: z.string().max(20).describe('g/L, mg/L, mM, µM, % w/v; mL/L for a stock')
			})
		)
		.max(200)
});

export const recipeListQuery = z.object({
	kind: z.enum(RECIPE_KINDS).optional(),
	status: z.enum(VERSION_STATUSES).optional(),
	component: z.string().max(80).optional(),
	q: z.string().max(120).optional(),
	page: z.coerce.number().int().min(1).default(1),
	pageSize: z.coerce.number().int().min(1).max(200).default(50)
});

export const componentListQuery = z.object({
	category: z.enum(COMPONENT_CATEGORIES).optional(),
	q: z
		.string()
		.max(120)
		.optional()
		.describe('Part of the name, a synonym, the formula, the CAS number or a GHS hazard code'),
	...pagingFields(COMPONENT_SORTS, { sort: 'name', dir: 'asc' })
});

const element = z.object({ symbol: z.string(), gPerL: z.number(), mmolPerL: z.number() });

export const analysisResponse = describes<RecipeAnalysis>()(
	z.object({
		components: z.array(
			z.object({
				id: z.string(),
				name: z.string(),
				gPerL: z.number(),
				mM: z.number().nullable(),
				osmolalityMOsmPerKg: z.number().nullable(),
				osmoticCoefficient: z.number().nullable(),
				lines: z.array(z.number()).describe('0-based indexes of the request lines it comes from')
			})
		),
		elements: z.array(element),
		totalCarbonGPerL: z.number(),
		totalNitrogenGPerL: z.number(),
		osmolality: z.object({
			estimateMOsmPerKg: z.number(),
			idealMOsmPerL: z.number(),
			excludedComponentIds: z
				.array(z.string())
				.describe('components without a molar mass (complex materials), left out of the estimate'),
			excludedNames: z.array(z.string()),
			minMOsmPerKg: z.number().nullable(),
			maxMOsmPerKg: z.number().nullable(),
			verdict: z.enum(['within', 'below', 'above', 'no-target']),
			note: z.string()
		}),
		ionicStrengthMolPerL: z.number(),
		dissolvedSolidsGPerL: z.number().describe('Σ g/L of the components as weighed'),
		temperatureC: z.number(),
		warnings: z.array(
			z.object({
				kind: z.enum(['solubility', 'precipitation']),
				basis: z.string(),
				message: z.string(),
				lines: z.array(z.number())
			})
		),
		notes: z.array(z.string()),
		hazards: z.array(
			z.object({ code: z.string(), text: z.string(), components: z.array(z.string()) })
		)
	})
);

export const previewResponse = describes<PreviewAnalysis>()(
	analysisResponse.extend({
		leftOut: z
			.array(z.object({ path: z.string(), message: z.string() }))
			.describe(
				'problems of the lines left out of this analysis, at lines.<i>.<field> of the request; the other lines are analysed'
			)
	})
);

export const recipeListResponse = describes<{
	items: RecipeSummary[];
	total: number;
	page: number;
	pageSize: number;
}>()(
	z.object({
		items: z.array(
			z.object({
				id: z.string(),
				name: z.string(),
				kind: z.enum(RECIPE_KINDS),
				ownerName: z.string(),
				latest: z.object({ n: z.int(), status: z.enum(VERSION_STATUSES), updatedAt: isoTime() }),
				approvedN: z.int().nullable().describe('the approved version, if any'),
				versionCount: z.int()
			})
		),
		total: z.int().describe('recipes matching the query, all pages'),
		page: z.int(),
		pageSize: z.int()
	})
);

const recipeRow = {
	id: z.string(),
	name: z.string(),
	kind: z.enum(RECIPE_KINDS),
	ownerId: z.string(),
	createdAt: isoTime()
};

export const recipeResponse = describes<ReturnType<typeof recipeView>>()(
	z.object({
		recipe: z.object({ ...recipeRow, ownerName: z.string().nullable() }),
		versions: z.array(
			z.object({
				id: z.string(),
				n: z.int(),
				status: z.enum(VERSION_STATUSES),
				authorId: z.string(),
				authorName: z.string(),
				approvedByName: z.string().nullable(),
				createdAt: isoTime(),
				updatedAt: isoTime(),
				submittedAt: isoTime().nullable(),
				approvedAt: isoTime().nullable(),
				retiredAt: isoTime().nullable(),
				basedOnVersionId: z.string().nullable(),
				changeNote: z.string()
			})
		)
	})
);

type VersionView = ReturnType<typeof versionView>;

export const versionResponse = describes<
	Omit<VersionView, 'analysis'> & { composition: VersionView['analysis'] }
>()(
	z.object({
		recipe: z.object(recipeRow),
		version: z.object({
			id: z.string(),
			recipeId: z.string(),
			n: z.int(),
			status: z.enum(VERSION_STATUSES),
			authorId: z.string(),
			authorName: z.string().nullable(),
			basedOnVersionId: z.string().nullable(),
			targetPh: z.number().nullable(),
			osmolalityMinMOsmPerKg: z.number().nullable(),
			osmolalityMaxMOsmPerKg: z.number().nullable(),
			preparationTemperatureC: z.number(),
			shelfLifeDays: z.int().nullable(),
			storage: z.string(),
			instructions: z.string(),
			changeNote: z.string(),
			revision: z.int(),
			updatedById: z.string().nullable(),
			createdAt: isoTime(),
			updatedAt: isoTime(),
			submittedAt: isoTime().nullable(),
			approvedAt: isoTime().nullable(),
			approvedById: z.string().nullable(),
			approvedByName: z.string().nullable(),
			retiredAt: isoTime().nullable()
		}),
		lines: z.array(
			z.object({
				id: z.string(),
				position: z.int(),
				kind: z.enum(LINE_KINDS),
				componentId: z.string().nullable(),
				componentName: z.string().nullable(),
				formula: z.string().nullable(),
				shelfFormId: z.string().nullable(),
				shelfFormName: z.string().nullable(),
				stockRecipeId: z.string().nullable(),
				stockRecipeName: z.string().nullable(),
				stockVersionN: z.int().nullable(),
				amount: z.number(),
				unit: z.string(),
				tolerancePercent: z.number(),
				note: z.string()
			})
		),
		composition: analysisResponse
			.nullable()
			.describe('null when the version cannot be analysed; analysisError says why'),
		analysisError: z.string().nullable(),
		signatures: z.array(signatureResponse)
	})
);

export const componentListResponse = describes<{
	items: Component[];
	total: number;
	page: number;
	limit: number;
}>()(
	z.object({
		items: z.array(
			z.object({
				id: z.string(),
				name: z.string(),
				category: z.string(),
				formula: z.string().nullable(),
				molarMassGPerMol: z.number().nullable(),
				casNumber: z.string().nullable(),
				elementalMassFractions: z
					.record(z.string(), z.number())
					.nullable()
					.describe('complex materials: g element per g'),
				fractionsNote: z.string().nullable(),
				ions: z
					.array(z.object({ ion: z.string(), count: z.number(), charge: z.number() }))
					.nullable(),
				osmoticCoefficient: z.number().nullable(),
				osmoticCoefficientSource: z.string().nullable(),
				solubility: z
					.object({
						points: z.array(z.object({ temperatureC: z.number(), gPerL: z.number() })),
						basisFormula: z.string().nullable().optional(),
						source: z.string().nullable().optional()
					})
					.nullable(),
				ghsHazards: z.array(z.object({ code: z.string(), text: z.string() })),
				hazardSource: z.string().nullable(),
				storage: z.string(),
				basisComponentId: z.string().nullable(),
				synonyms: z.array(z.string()),
				fromReference: z.boolean(),
				reorderLevelG: z.number().nullable(),
				densityGPerMl: z.number().nullable(),
				revision: z.int(),
				createdAt: isoTime(),
				updatedAt: isoTime()
			})
		),
		total: z.int().describe('Every component the filter matches, over all pages'),
		page: z.int(),
		limit: z.int()
	})
);

export const recipesOperations: ApiOperation[] = [
	{
		method: 'get',
		path: '/api/v1/recipes',
		summary:
			'Lists recipes. Query: kind, status (has a version in it), component (id; has a version containing it), q (name contains), page, pageSize',
		act: 'recipe.view',
		query: recipeListQuery,
		response: recipeListResponse
	},
	{
		method: 'get',
		path: '/api/v1/recipes/{id}',
		summary: 'One recipe with its versions',
		act: 'recipe.view',
		response: recipeResponse
	},
	{
		method: 'get',
		path: '/api/v1/recipes/{id}/versions/{n}',
		summary:
			'One version with its lines, composition (elements, osmolality, warnings) and signatures',
		act: 'recipe.view',
		response: versionResponse
	},
	{
		method: 'post',
		path: '/api/v1/recipes/preview',
		summary:
			'Composition of lines as typed: per element, total C and N, osmolality against the range, solubility at the preparation temperature, precipitation pairs. Line problems come back as errors at lines.<i>.<field>',
		act: 'calculation.run',
		request: previewRequest,
		response: previewResponse
	},
	{
		method: 'get',
		path: '/api/v1/components',
		summary: 'The component library, a page at a time, filtered, searched and sorted',
		act: 'component.view',
		query: componentListQuery,
		response: componentListResponse
	}
];
