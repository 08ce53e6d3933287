import { z } from 'zod';
import { COMPONENT_CATEGORIES } from '$lib/recipes';
import { componentForm, type ComponentField } from '../../components/component-form';
import type { Component } from '../../db/schema';
import type { ApiOperation } from '../openapi';
import { describedFields, labelsOf } from '../field-labels';
import { describes, isoTime } from '../shapes';

/** The component form's labels: a refusal's detail names each field by them. */
export const COMPONENT_FIELD_LABELS: Record<ComponentField, string> = {
	name: 'Name',
	category: 'Category',
	formula: 'Formula',
	molarMassGPerMol: 'Average molar mass, g/mol (no formula only)',
	casNumber: 'CAS number (optional)',
	elementalMassFractions: 'Elemental mass fractions (complex materials)',
	ions: 'Ions it dissolves into',
	osmoticCoefficient: 'Osmotic coefficient φ',
	solubility: 'Solubility in water (°C : g/L)',
	solubilityBasisFormula: 'Solubility refers to (formula)',
	ghsHazards: 'GHS hazard statements',
	storage: 'Storage',
	basisComponent: 'Form of (basis component)'
};

export const componentLabel = labelsOf(COMPONENT_FIELD_LABELS);

const HINTS: Partial<Record<ComponentField, string>> = {
	category: `one of ${COMPONENT_CATEGORIES.join(', ')}`,
	formula: 'e.g. MgSO4·7H2O; empty for a complex material',
	molarMassGPerMol: 'a number, or its text read by the site’s decimal mark; only without a formula',
	casNumber: 'e.g. 7647-14-5; the check digit is verified',
	elementalMassFractions: 'g element per g material, e.g. "C=0.39; N=0.105; P=0.018"',
	ions: 'e.g. "2 Na+; HPO4^2-"; empty for a non-electrolyte',
	osmoticCoefficient: 'a number, or its text; empty: assumed ideal (φ = 1)',
	solubility: '°C : g/L, e.g. "25:360; 0:357"',
	solubilityBasisFormula: 'only when the values are for another form, e.g. the anhydrous salt',
	ghsHazards: 'e.g. "H302; H319"; codes we know fill in their text, otherwise "H999: text"',
	storage: 'e.g. 2–8 °C, dry, protected from light',
	basisComponent: 'the id or name of the component this one is a form of'
};

/**
 * The component form's schema, strict: a misspelt key is refused by name. A field left out is
 * empty, as on the form, so a PUT replaces every editable field.
 */
export const componentRequest = z.strictObject(
	describedFields(
		componentForm.shape,
		Object.fromEntries(
			Object.entries(COMPONENT_FIELD_LABELS).map(([field, label]) => {
				const hint = HINTS[field as ComponentField];
				return [field, hint ? `${label}: ${hint}` : label];
			})
		)
	)
);

export const componentResponse = describes<Component>()(
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
		ions: z.array(z.object({ ion: z.string(), count: z.number(), charge: z.number() })).nullable(),
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
		revision: z.int().describe('the ETag: send it back in If-Match to update'),
		createdAt: isoTime(),
		updatedAt: isoTime()
	})
);

export const componentsOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/components',
		summary:
			'Adds a component to the library with the component form’s checks (every field problem at once, at its field) and audit; answers it with Location and ETag',
		act: 'component.edit',
		request: componentRequest,
		response: componentResponse,
		successStatus: 201
	},
	{
		method: 'get',
		path: '/api/v1/components/{id}',
		summary: 'One component; its ETag is its revision',
		act: 'component.view',
		response: componentResponse
	},
	{
		method: 'put',
		path: '/api/v1/components/{id}',
		summary:
			'Replaces the editable fields of a component (a field left out is emptied) with the component form’s checks and audit. Needs If-Match with the ETag GET gave; answers the component with its new ETag',
		act: 'component.edit',
		request: componentRequest,
		response: componentResponse,
		errors: [409, 412, 428]
	}
];
