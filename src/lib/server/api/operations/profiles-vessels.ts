import { z } from 'zod';
import { ELEMENT_ROLES, VALUE_CONFIDENCES } from '$chemistry';
import { ORGANISM_GROUPS, PROFILE_KINDS, VESSEL_KLA_MODES, YIELD_METHODS } from '$lib/studies';
import type { OrganismProfileRow, VesselRow } from '../../db/schema';
import { keysetFields, type KeysetPage } from '../../keyset';
import { profileSchema } from '../../studies/profile-store';
import { RECORD_SORTS } from '../../studies/record-lists';
import { vesselSchema } from '../../studies/vessel-store';
import type { ApiOperation } from '../openapi';
import { describedFields, labelsOf } from '../field-labels';
import { describes, isoTime } from '../shapes';

type ProfileField = keyof typeof profileSchema.shape;
type VesselField = keyof typeof vesselSchema.shape;

/** The organism profile form's labels: a refusal's detail names each field by them. */
const PROFILE_FIELD_LABELS: Record<ProfileField, string> = {
	name: 'Name',
	group: 'Group',
	kind: 'Demand described as',
	presetId: 'Fill the elemental fractions from a published table',
	biomassFormula: 'Biomass formula (per C-mol, ash-free)',
	ashFraction: 'Ash fraction, g/g',
	elementalFractions: 'Elemental mass fractions, g per g dry biomass',
	fractionsSource: 'Source of the fractions',
	componentRequirements: 'Component requirements, g per g dry biomass',
	perCellConsumption: 'Per-cell consumption',
	cellDryMassPg: 'Cell dry mass, pg/cell',
	carbonSourceId: 'Carbon source',
	yieldXSMethod: 'Yx/s obtained by',
	yieldXSGPerG: 'Yx/s on the carbon source, g/g',
	respiratoryQuotient: 'Measured RQ, mol CO2/mol O2',
	substrateYields: 'Yields on further substrates',
	muMaxPerH: 'μmax, 1/h',
	ksGPerL: 'Ks, g/L',
	maintenanceGPerGH: 'Maintenance, g substrate/(g·h)',
	yieldXO2GPerG: 'Yx/O2, g/g',
	qO2MmolPerGH: 'qO2, mmol O2/(g·h)',
	notes: 'Notes'
};

/** The words of the form's element table, for `element.<symbol>.<part>`. */
const ELEMENT_PART_LABELS = {
	role: (symbol: string) => `Role of ${symbol}`,
	confidence: (symbol: string) => `How sure the value of ${symbol} is`,
	source: (symbol: string) => `Source of ${symbol}`
};

const profileFieldLabel = labelsOf(PROFILE_FIELD_LABELS);

export function profileLabel(path: string): string {
	const element = /^element\.([^.]+)(?:\.(role|confidence|source))?$/.exec(path);
	if (!element) return profileFieldLabel(path);
	const part = element[2] as keyof typeof ELEMENT_PART_LABELS | undefined;
	return part ? ELEMENT_PART_LABELS[part](element[1]) : `Element ${element[1]}`;
}

const PROFILE_HINTS: Partial<Record<ProfileField, string>> = {
	group: ORGANISM_GROUPS.join(', '),
	kind: PROFILE_KINDS.join(', '),
	presetId:
		'the id of a published biomass composition; fills blank fractions and names their source',
	ashFraction: 'a number, or its text read by the site’s decimal mark',
	elementalFractions: 'one per line, "N 0.14"',
	componentRequirements: 'one per line, a component id and g/g, "l-glutamine 0.05"',
	perCellConsumption:
		'one per line, "l-glutamine 3 mmol" (per 10⁹ cells) or "d-glucose 350 pg" (per cell)',
	carbonSourceId: 'a component id from the library',
	yieldXSMethod: YIELD_METHODS.join(', '),
	substrateYields:
		'one per line, a component id and Yx/s in g/g ("l-glutamine 0.68"), or "from" and the element it alone supplies ("ammonium-sulfate from N")'
};

/** The labels of the vessel form. */
const VESSEL_FIELD_LABELS: Record<VesselField, string> = {
	name: 'Name',
	minWorkingVolumeL: 'Minimum working volume, L',
	maxWorkingVolumeL: 'Maximum working volume, L',
	kLaMode: 'kLa is',
	kLaPerH: 'kLa, 1/h',
	correlationK: 'k (gives kLa in 1/s)',
	correlationA: 'a (exponent of P/V)',
	correlationB: 'b (exponent of v_s)',
	powerPerVolumeWPerM3: 'P/V, W/m³',
	superficialVelocityMPerS: 'Superficial gas velocity v_s, m/s',
	maxGasFlowVvm: 'Maximum gas flow, vvm',
	o2EnrichmentAllowed: 'O2 enrichment allowed',
	maxPressureKPa: 'Maximum pressure (absolute), kPa',
	temperatureC: 'Temperature, °C',
	coolingCapacityW: 'Cooling capacity, W',
	agitationPowerW: 'Agitation power into the broth, W',
	vesselDiameterM: 'Vessel inner diameter T, m',
	impellerDiameterM: 'Impeller diameter D, m',
	impellerCount: 'Number of impellers',
	powerNumber: 'Impeller power number Np',
	plannedAgitationRpm: 'Planned stirrer speed, rpm',
	plannedGasFlowLPerMin: 'Planned gas flow, L/min',
	notes: 'Notes'
};

export const vesselLabel = labelsOf(VESSEL_FIELD_LABELS);

const VESSEL_HINTS: Partial<Record<VesselField, string>> = {
	kLaMode: `${VESSEL_KLA_MODES.join(', ')}: typed in, kLa = k·(P/V)^a·(v_s)^b (van 't Riet 1979), or the vessel's measured map`,
	o2EnrichmentAllowed: 'true or false'
};

function descriptions(labels: Record<string, string>, hints: Record<string, string>) {
	return Object.fromEntries(
		Object.entries(labels).map(([field, label]) => [
			field,
			hints[field] ? `${label}: ${hints[field]}` : label
		])
	);
}

/** Each element's role, confidence and source as the form's element table takes them. */
const elementStatementsRequest = z
	.record(
		z.string().regex(/^[A-Z][a-z]?$/),
		z.strictObject({
			role: z
				.string()
				.optional()
				.describe(`${ELEMENT_ROLES.join(' or ')}; empty: the default`),
			confidence: z.string().optional().describe(VALUE_CONFIDENCES.join(', ')),
			source: z.string().optional().describe('the table, paper or analysis the value comes from')
		}),
		{
			error: (issue) =>
				issue.code === 'invalid_key'
					? 'Name each element by its symbol, such as N or Fe.'
					: undefined
		}
	)
	.optional()
	.describe(
		'By element symbol: its role, how sure its value is and its source; only elements the profile gives a value for are kept'
	);

/**
 * The organism profile form's schema, strict (a misspelt key is refused by name), with the element
 * table as `element`. JSON numbers are numbers; a number sent as text is read as the form reads it.
 */
export const profileRequest = z.strictObject({
	...describedFields(profileSchema.shape, descriptions(PROFILE_FIELD_LABELS, PROFILE_HINTS)),
	element: elementStatementsRequest
});

/** The vessel form's schema, strict: a misspelt key is refused by name. */
export const vesselRequest = z.strictObject(
	describedFields(vesselSchema.shape, descriptions(VESSEL_FIELD_LABELS, VESSEL_HINTS))
);

const recordListQuery = (what: string) =>
	z.object({
		q: z.string().max(120).optional().describe(`Part of the ${what}’s name`),
		...keysetFields(RECORD_SORTS, { sort: 'name', dir: 'asc' })
	});

export const profileListQuery = recordListQuery('profile');
export const vesselListQuery = recordListQuery('vessel');

const revision = z.int().describe('the ETag: send it back in If-Match to update');

export const profileResponse = describes<OrganismProfileRow>()(
	z.object({
		id: z.string(),
		name: z.string(),
		group: z.enum(ORGANISM_GROUPS),
		kind: z.enum(PROFILE_KINDS),
		biomassFormula: z.string().nullable(),
		ashFraction: z.number().nullable(),
		elementalFractions: z
			.record(z.string(), z.number())
			.nullable()
			.describe('g element per g dry biomass'),
		fractionsSource: z.string().nullable(),
		elementStatements: z
			.record(
				z.string(),
				z.object({
					role: z.enum(ELEMENT_ROLES).optional(),
					confidence: z.enum(VALUE_CONFIDENCES).optional(),
					source: z.string().optional()
				})
			)
			.nullable(),
		componentRequirements: z
			.record(z.string(), z.number())
			.nullable()
			.describe('g component per g dry biomass'),
		perCellConsumption: z
			.array(
				z.object({
					key: z.string(),
					basis: z.enum(['element', 'component']),
					pgPerCell: z.number().optional(),
					mmolPer1e9Cells: z.number().optional(),
					molarMassGPerMol: z.number().optional(),
					formula: z.string().optional()
				})
			)
			.nullable(),
		cellDryMassPg: z.number().nullable(),
		carbonSourceId: z.string().nullable(),
		yieldXSGPerG: z.number().nullable(),
		yieldXSMethod: z.enum(YIELD_METHODS),
		respiratoryQuotient: z.number().nullable(),
		substrateYields: z.array(
			z.union([
				z.object({
					componentId: z.string(),
					method: z.literal('entered'),
					yieldGPerG: z.number()
				}),
				z.object({
					componentId: z.string(),
					method: z.literal('soleSource'),
					element: z.string(),
					yieldGPerG: z.number()
				})
			])
		),
		muMaxPerH: z.number().nullable(),
		ksGPerL: z.number().nullable(),
		maintenanceGPerGH: z.number().nullable(),
		yieldXO2GPerG: z.number().nullable(),
		qO2MmolPerGH: z.number().nullable(),
		notes: z.string(),
		isDemo: z.boolean(),
		revision,
		createdAt: isoTime(),
		updatedAt: isoTime()
	})
);

export const vesselResponse = describes<VesselRow>()(
	z.object({
		id: z.string(),
		name: z.string(),
		minWorkingVolumeL: z.number(),
		maxWorkingVolumeL: z.number(),
		kLaMode: z.enum(VESSEL_KLA_MODES),
		kLaPerH: z.number().nullable(),
		correlationK: z.number().nullable(),
		correlationA: z.number().nullable(),
		correlationB: z.number().nullable(),
		powerPerVolumeWPerM3: z.number().nullable(),
		superficialVelocityMPerS: z.number().nullable(),
		maxGasFlowVvm: z.number(),
		o2EnrichmentAllowed: z.boolean(),
		maxPressureKPa: z.number().describe('absolute'),
		temperatureC: z.number(),
		coolingCapacityW: z.number(),
		agitationPowerW: z.number().nullable(),
		vesselDiameterM: z.number().nullable(),
		impellerDiameterM: z.number().nullable(),
		impellerCount: z.int(),
		powerNumber: z.number().nullable(),
		plannedAgitationRpm: z.number().nullable(),
		plannedGasFlowLPerMin: z.number().nullable(),
		notes: z.string(),
		isDemo: z.boolean(),
		revision,
		createdAt: isoTime(),
		updatedAt: isoTime()
	})
);

const pageOf = <Item extends z.ZodType>(item: Item, what: string) =>
	z.object({
		items: z.array(item),
		total: z.int().describe(`Every ${what} the search matches, over all pages`),
		limit: z.int(),
		next: z
			.string()
			.nullable()
			.describe('Send it back as `after` for the next page; null on the last page')
	});

export const profileListResponse = describes<KeysetPage<OrganismProfileRow>>()(
	pageOf(profileResponse, 'profile')
);
export const vesselListResponse = describes<KeysetPage<VesselRow>>()(
	pageOf(vesselResponse, 'vessel')
);

/** The four operations of one record: list, create, read, replace. */
function recordOperations(o: {
	path: string;
	/** "an organism profile", "a vessel" */
	one: string;
	many: string;
	/** the page whose form writes it */
	form: string;
	query: z.ZodObject;
	request: z.ZodType;
	response: z.ZodType;
	list: z.ZodType;
}): ApiOperation[] {
	const checks = `with the ${o.form} form’s checks (field problems at once, then its rules one at a time) and audit`;
	return [
		{
			method: 'get',
			path: o.path,
			summary: `Lists ${o.many} a page at a time (cursor: send \`next\` back as \`after\`), searched by name, sorted by name or last change`,
			act: 'study.use',
			query: o.query,
			response: o.list
		},
		{
			method: 'post',
			path: o.path,
			summary: `Adds ${o.one} ${checks}; answers it with Location and ETag. A name in use is a 409`,
			act: 'study.use',
			request: o.request,
			response: o.response,
			successStatus: 201,
			errors: [409]
		},
		{
			method: 'get',
			path: `${o.path}/{id}`,
			summary: `One of the ${o.many}; its ETag is its revision`,
			act: 'study.use',
			response: o.response
		},
		{
			method: 'put',
			path: `${o.path}/{id}`,
			summary: `Replaces the editable fields of ${o.one} (a field left out is emptied) ${checks}. Needs If-Match with the ETag GET gave; answers it with its new ETag`,
			act: 'study.use',
			request: o.request,
			response: o.response,
			errors: [409, 412, 428]
		}
	];
}

export const profilesVesselsOperations: ApiOperation[] = [
	...recordOperations({
		path: '/api/v1/profiles',
		one: 'an organism profile',
		many: 'organism profiles',
		form: 'organism profile',
		query: profileListQuery,
		request: profileRequest,
		response: profileResponse,
		list: profileListResponse
	}),
	...recordOperations({
		path: '/api/v1/vessels',
		one: 'a vessel',
		many: 'vessels',
		form: 'vessel',
		query: vesselListQuery,
		request: vesselRequest,
		response: vesselResponse,
		list: vesselListResponse
	})
];
