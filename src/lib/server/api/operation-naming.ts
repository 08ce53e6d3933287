// Names the OpenAPI document gives an operation, derived from its method and path so that a new
// operation gets them without anyone choosing: generated clients and the reference page use them.

const API_PREFIX = '/api/v1/';

/** `get-ready` or `openapi.json` → `GetReady`, `OpenapiJson`. */
function pascalCase(segment: string): string {
	return segment
		.split(/[^A-Za-z0-9]+/)
		.filter(Boolean)
		.map((word) => word[0].toUpperCase() + word.slice(1))
		.join('');
}

/**
 * The method, then each path segment after /api/v1 in PascalCase, a parameter as `By<Name>`:
 * `get /api/v1/recipes/{id}/versions/{n}` → `getRecipesByIdVersionsByN`.
 */
export function operationIdOf(method: string, path: string): string {
	const segments = path.startsWith(API_PREFIX) ? path.slice(API_PREFIX.length).split('/') : [path];
	const words = segments.map((segment) => {
		const parameter = /^\{(\w+)\}$/.exec(segment);
		return parameter ? `By${pascalCase(parameter[1])}` : pascalCase(segment);
	});
	return `${method.toLowerCase()}${words.join('')}`;
}

/** The group an operation belongs to: the first path segment after /api/v1 (`recipes`, `runs`). */
export function tagOf(path: string): string {
	return path.startsWith(API_PREFIX) ? path.slice(API_PREFIX.length).split('/')[0] : path;
}

/** What each group holds, for the document's `tags` and the reference page; a new group may have none yet. */
export const TAG_DESCRIPTIONS: Record<string, string> = {
	health: 'Whether the service and its database answer',
	'openapi.json': 'This description of the API',
	me: 'The person the request is made as',
	session: 'Signing a script in and out with a session cookie',
	formula: 'Chemical formulas read and weighed',
	stoichiometry: 'Black-box growth balances solved by element balances',
	oxygen: 'Dissolved-oxygen saturation',
	sufficiency: 'Whether a medium supplies what a target biomass needs',
	recipes: 'Media and feed recipes, their versions and the live composition preview',
	components: 'The component library',
	profiles: 'Organism profiles',
	vessels: 'Vessels and their oxygen transfer',
	simulate: 'Culture simulation',
	chemostat: 'Chemostat steady states',
	productivity: 'Batch against continuous productivity',
	fit: 'Growth values fitted to run data',
	scenarios: 'Saved simulation scenarios',
	lots: 'Lots received, their stock ledger and where they were used',
	batches: 'Batches planned and prepared from approved recipes',
	studies: 'Studies: whether a medium, its feeds and a vessel reach a target, and feed design',
	runs: 'Runs: their data and the analysis against the plan',
	audit: 'The audit trail'
};
