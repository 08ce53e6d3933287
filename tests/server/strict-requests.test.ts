import type { RequestHandler } from '@sveltejs/kit';
import { describe, expect, it, vi } from 'vitest';
import { postJson } from './endpoint-call';

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const routes: Record<string, () => Promise<{ POST: RequestHandler }>> = {
	'/api/v1/formula': () => import('../../src/routes/api/v1/formula/+server'),
	'/api/v1/stoichiometry': () => import('../../src/routes/api/v1/stoichiometry/+server'),
	'/api/v1/oxygen/saturation': () => import('../../src/routes/api/v1/oxygen/saturation/+server'),
	'/api/v1/sufficiency': () => import('../../src/routes/api/v1/sufficiency/+server'),
	'/api/v1/chemostat/steady-state': () =>
		import('../../src/routes/api/v1/chemostat/steady-state/+server'),
	'/api/v1/productivity/batch-vs-continuous': () =>
		import('../../src/routes/api/v1/productivity/batch-vs-continuous/+server'),
	'/api/v1/fit/growth': () => import('../../src/routes/api/v1/fit/growth/+server'),
	'/api/v1/simulate': () => import('../../src/routes/api/v1/simulate/+server'),
	'/api/v1/recipes/preview': () => import('../../src/routes/api/v1/recipes/preview/+server'),
	'/api/v1/studies/evaluate': () => import('../../src/routes/api/v1/studies/evaluate/+server'),
	'/api/v1/studies/{id}/feed-design': () =>
		import('../../src/routes/api/v1/studies/[id]/feed-design/+server')
};

// Both roles that may use every one of these endpoints (the study endpoints need one of them).
const scientist = {
	id: 'u-strict',
	email: 'strict@lab.test',
	name: 'Strict',
	roles: ['engineer', 'media_scientist']
};

async function post(route: string, body: unknown): Promise<Response> {
	const { POST } = await routes[route]();
	return postJson(POST, route.replace('{id}', 'study-1'), body, {
		user: scientist,
		params: { id: 'study-1' }
	});
}

const species = [
	{ id: 'glucose', formula: 'C6H12O6' },
	{ id: 'oxygen', formula: 'O2', ashFracton: 0 },
	{ id: 'biomass', formula: 'CH1.8O0.5N0.2' }
];

/** [route, body with misspelt keys, the paths that must name them] */
const misspelt: [string, unknown, string[]][] = [
	['/api/v1/formula', { formula: 'NaCl', fromula: 'KCl' }, ['fromula']],
	[
		'/api/v1/stoichiometry',
		{
			species,
			specifications: [{ kind: 'rate', species: 'glucose', mol: -1, relativeErorr: 0.1 }]
		},
		['species.1.ashFracton', 'specifications.0.relativeErorr']
	],
	// The old name of the field, refused rather than read as air.
	[
		'/api/v1/oxygen/saturation',
		{ temperatureC: 37, oxygenMoleFraction: 1 },
		['oxygenMoleFraction']
	],
	[
		'/api/v1/sufficiency',
		{
			profile: { kind: 'preset', id: 'bacterium', name: 'x' },
			target: { cellsPerMl: 1e9, cellDryMasPg: 300 },
			supply: { sources: [{ volumeLitres: 1, elementsGPerL: { C: 10 } }] },
			carbon: { basis: 'element', yieldGPerGCarbon: 1, yeild: 2 }
		},
		['profile.name', 'target.cellDryMasPg', 'supply.sources.0.volumeLitres', 'carbon.yeild']
	],
	[
		'/api/v1/chemostat/steady-state',
		{
			muMaxPerH: 0.6,
			ksGPerL: 0.05,
			yieldXS: 0.5,
			feedSubstrateGPerL: 20,
			dilutionPerH: 0.05,
			maintenanceGPerH: 0.05
		},
		['maintenanceGPerH']
	],
	[
		'/api/v1/productivity/batch-vs-continuous',
		{
			muMaxPerH: 0.6,
			ksGPerL: 0.05,
			yieldXS: 0.5,
			substrateGPerL: 20,
			inoculumGPerL: 0.1,
			dilutionPerH: 0.4,
			turnaround: { cleaningHours: 4 }
		},
		['turnaround.cleaningHours']
	],
	[
		'/api/v1/fit/growth',
		{ timeH: [0, 1, 2], biomassGPerL: [0.1, 0.2, 0.4], fitYeild: true },
		['fitYeild']
	],
	[
		'/api/v1/simulate',
		{
			mode: 'batch',
			// Yx/O2 given: the schema reports every refusal at once, and this body should have only one.
			kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5, yieldXO2: 1 },
			initial: { biomassGPerL: 0.1, substrateGPerL: 10, volumeL: 1 },
			oxygen: { kLaPerH: 100, saturationMgPerL: 7, o2MoleFractin: 0.3 },
			endH: 10,
			outputEveryH: 1
		},
		['oxygen.o2MoleFractin']
	],
	[
		'/api/v1/recipes/preview',
		{ lines: [{ componentId: 'sodium-chloride', amount: 5, unit: 'g/L', amout: 6 }] },
		['lines.0.amout']
	],
	[
		'/api/v1/studies/evaluate',
		{ studyId: 'study-1', whatIf: { o2MoleFractin: 0.3 } },
		['whatIf.o2MoleFractin']
	],
	[
		'/api/v1/studies/{id}/feed-design',
		{ componentIds: ['d-glucose'], feedVolumeL: 1, temperatureC: 20, volumeL: 2 },
		['volumeL']
	]
];

describe('every science endpoint refuses an unknown key and names it', () => {
	for (const [route, body, paths] of misspelt) {
		it(`${route}: 400 at ${paths.join(', ')}`, async () => {
			const response = await post(route, body);
			expect(response.status).toBe(400);
			expect(response.headers.get('content-type')).toContain('application/problem+json');
			const problem = (await response.json()) as {
				detail: string;
				errors: { path: string; message: string }[];
			};
			expect(problem.errors.map((e) => e.path).sort()).toEqual([...paths].sort());
			for (const { path, message } of problem.errors) {
				const key = path.split('.').at(-1)!;
				expect(message).toContain(`"${key}"`);
				expect(problem.detail).toContain(path);
			}
		});
	}
});

describe('a value that fits none of a union’s shapes', () => {
	it('is reported against the closest shape, at the paths inside it', async () => {
		// target is { biomassGPerL } or { cellsPerMl, cellDryMassPg? }: this one is nearer the second.
		const response = await post('/api/v1/sufficiency', {
			profile: { kind: 'preset', id: 'bacterium' },
			target: { cellsPerMl: 'many', cellDryMasPg: 300 },
			supply: { sources: [{ elementsGPerL: { C: 10 } }] }
		});
		expect(response.status).toBe(400);
		const problem = (await response.json()) as { errors: { path: string; message: string }[] };
		expect(problem.errors).toEqual([
			{ path: 'target.cellsPerMl', message: 'Give a number.' },
			{
				path: 'target.cellDryMasPg',
				message: 'Unknown field "cellDryMasPg": this request has no such field; check its spelling.'
			}
		]);
	});
});

describe('POST /api/v1/oxygen/saturation speaks o2MoleFraction', () => {
	it('gives pure O2 about 1/0.20946 times the air value and echoes the fraction', async () => {
		const air = await (await post('/api/v1/oxygen/saturation', { temperatureC: 37 })).json();
		const pure = await (
			await post('/api/v1/oxygen/saturation', { temperatureC: 37, o2MoleFraction: 1 })
		).json();
		// Benson & Krause 1984 (APHA 4500-O) at 37 °C: 6.727 mg/L for air (chemistry/REFERENCES.md, derived);
		// Henry's law scales it by x/0.20946 (dry-air O2 fraction, from memory): 32.12 mg/L for pure O2.
		expect(air.mgPerL).toBeCloseTo(6.727, 2);
		expect(air.o2MoleFraction).toBe(0.20946);
		expect(pure.o2MoleFraction).toBe(1);
		expect(pure.mgPerL).toBeCloseTo(6.727 / 0.20946, 1);
		expect(pure).not.toHaveProperty('oxygenMoleFraction');
	});
});
