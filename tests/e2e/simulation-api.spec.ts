import { expect, test } from './fixtures';

const fedBatch = {
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.6, ksGPerL: 0.05, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.1, substrateGPerL: 20, volumeL: 5 },
	feed: { strategy: 'exponential', substrateGPerL: 500, muSetPerH: 0.2, startH: 8 },
	maxVolumeL: 12,
	endH: 24,
	outputEveryH: 0.5
};

test.describe('simulation endpoints need a signed-in user', () => {
	for (const path of [
		'/api/v1/simulate',
		'/api/v1/chemostat/steady-state',
		'/api/v1/productivity/batch-vs-continuous',
		'/api/v1/fit/growth',
		'/api/v1/scenarios'
	]) {
		test(`${path} answers 401 problem+json when signed out`, async ({ request }) => {
			const response = await request.post(path, { data: {} });
			expect(response.status()).toBe(401);
			expect(response.headers()['content-type']).toContain('application/problem+json');
		});
	}
});

test.describe('simulation endpoints, signed in', () => {
	test.use({ role: 'engineer' });

	test('simulate: a fed-batch answers the series at the output times, without O2 series when no oxygen block is given', async ({
		page
	}) => {
		const response = await page.request.post('/api/v1/simulate', { data: fedBatch });
		expect(response.status()).toBe(200);
		const body = await response.json();
		expect(body.t).toHaveLength(49);
		for (const key of ['biomassGPerL', 'substrateGPerL', 'productGPerL', 'volumeL', 'feedLPerH'])
			expect(body[key]).toHaveLength(49);
		expect(body.dissolvedOxygenMgPerL).toBeNull();
		expect(body.ourMmolPerLH).toBeNull();
		expect(body.events.map((e: { kind: string }) => e.kind)).toContain('feedStarted');
		// Without a feed before 8 h the volume stays at V0 (mass balance dV/dt = F = 0).
		expect(body.volumeL[16]).toBe(5);
		expect(body.volumeL[48]).toBeGreaterThan(5);
	});

	const refusals: [string, Record<string, unknown>, string, RegExp][] = [
		[
			'μset ≥ μmax',
			{ feed: { ...fedBatch.feed, muSetPerH: 0.6 } },
			'feed.muSetPerH',
			/^Feed μset \(0\.6 \/h\) must be below μmax/
		],
		[
			'an expression with an unknown name',
			{ feed: { strategy: 'expression', substrateGPerL: 500, expression: '0.1 * t + volume' } },
			'feed.expression',
			/Unknown name "volume"/
		],
		[
			'an expression that does not parse',
			{ feed: { strategy: 'expression', substrateGPerL: 500, expression: '0.1 * (t' } },
			'feed.expression',
			/cannot be read/
		],
		[
			'a feed no richer than the medium',
			{ feed: { ...fedBatch.feed, substrateGPerL: 10 } },
			'feed.substrateGPerL',
			/^Feed substrate Sf \(10 g\/L\) must exceed Substrate S₀/
		],
		[
			'a negative Ks',
			{ kinetics: { ...fedBatch.kinetics, ksGPerL: -1 } },
			'kinetics.ksGPerL',
			/greater than 0/
		],
		[
			'a zero volume',
			{ initial: { ...fedBatch.initial, volumeL: 0 } },
			'initial.volumeL',
			/greater than 0/
		],
		['an end time beyond the limit', { endH: 5000 }, 'endH', /at most 1440/],
		[
			'too many output points',
			{ endH: 1000, outputEveryH: 0.001 },
			'outputEveryH',
			/at most 50000/
		],
		['a number sent as text', { endH: '24' }, 'endH', /number/]
	];
	for (const [what, change, path, detail] of refusals) {
		test(`simulate: ${what} is a 400 naming ${path}`, async ({ page }) => {
			const response = await page.request.post('/api/v1/simulate', {
				data: { ...fedBatch, ...change }
			});
			expect(response.status()).toBe(400);
			expect(response.headers()['content-type']).toContain('application/problem+json');
			const body = await response.json();
			expect(body.errors.map((e: { path: string }) => e.path)).toContain(path);
			expect(body.detail).toMatch(detail);
		});
	}

	test('simulate: a run the integrator cannot follow is a 422 that says so, not numbers', async ({
		page
	}) => {
		// The feed switches on at S = 0.2 and uptake pulls S straight back: the state chatters on the
		// switch and the step size collapses.
		const response = await page.request.post('/api/v1/simulate', {
			data: {
				mode: 'fedBatch',
				kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
				initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
				feed: { strategy: 'expression', substrateGPerL: 200, expression: 'S < 0.2 ? 0.05 : 0' },
				endH: 20,
				outputEveryH: 1
			}
		});
		expect(response.status()).toBe(422);
		const body = await response.json();
		expect(body.detail).toMatch(/did not converge/);
		expect(body).not.toHaveProperty('t');
		// An absurd rate is an input mistake, named at its field, not a failed integration.
		const absurd = await page.request.post('/api/v1/simulate', {
			data: {
				...fedBatch,
				maxVolumeL: undefined,
				feed: { strategy: 'expression', substrateGPerL: 500, expression: '1e300 * exp(t)' }
			}
		});
		expect(absurd.status()).toBe(400);
		expect(JSON.stringify(await absurd.json())).toContain('feed.expression');
	});

	test('chemostat: the steady state matches the closed form and comes with a sweep', async ({
		page
	}) => {
		const input = {
			muMaxPerH: 0.6,
			ksGPerL: 0.05,
			yieldXS: 0.5,
			feedSubstrateGPerL: 20,
			dilutionPerH: 0.4,
			safetyMargin: 0.1
		};
		const response = await page.request.post('/api/v1/chemostat/steady-state', { data: input });
		expect(response.status()).toBe(200);
		const body = await response.json();
		// Monod 1949 growth; chemostat steady state after Herbert, Elsworth & Telling 1956:
		// S = Ks·D/(μmax − D), X = Y(Sf − S), D_crit = μmax·Sf/(Ks + Sf), D_opt = μmax(1 − √(Ks/(Ks + Sf))).
		const s = (0.05 * 0.4) / (0.6 - 0.4);
		expect(body.substrateGPerL).toBeCloseTo(s, 10);
		expect(body.biomassGPerL).toBeCloseTo(0.5 * (20 - s), 10);
		expect(body.productivityGPerLH).toBeCloseTo(0.4 * 0.5 * (20 - s), 10);
		const dCrit = (0.6 * 20) / 20.05;
		const dOpt = 0.6 * (1 - Math.sqrt(0.05 / 20.05));
		expect(body.criticalDilutionPerH).toBeCloseTo(dCrit, 10);
		expect(body.optimalDilutionPerH).toBeCloseTo(dOpt, 10);
		expect(body.washout).toBe(false);
		expect(body.sweep.length).toBeGreaterThan(10);
		expect(body.sweep.at(-1).dilutionPerH).toBeCloseTo(dCrit, 10);
		const dMargin = 0.9 * dCrit;
		expect(body.marginDilutionPerH).toBeCloseTo(dMargin, 10);
		const productivity = (d: number) => d * 0.5 * (20 - (0.05 * d) / (0.6 - d));
		expect(body.productivityLostToMargin).toBeCloseTo(
			1 - productivity(dMargin) / productivity(dOpt),
			8
		);
	});

	test('chemostat: a dilution above D_crit reports washout, and a margin of 1 names the field', async ({
		page
	}) => {
		const base = { muMaxPerH: 0.6, ksGPerL: 0.05, yieldXS: 0.5, feedSubstrateGPerL: 20 };
		const washout = await (
			await page.request.post('/api/v1/chemostat/steady-state', {
				data: { ...base, dilutionPerH: 0.7 }
			})
		).json();
		expect(washout).toMatchObject({ washout: true, biomassGPerL: 0, substrateGPerL: 20 });
		const bad = await page.request.post('/api/v1/chemostat/steady-state', {
			data: { ...base, dilutionPerH: 0.3, safetyMargin: 1 }
		});
		expect(bad.status()).toBe(400);
		expect((await bad.json()).errors[0].path).toBe('safetyMargin');
	});

	test('chemostat: Pirt maintenance lowers X at low D and moves D_opt; a negative m_s names the field', async ({
		page
	}) => {
		const base = {
			muMaxPerH: 0.6,
			ksGPerL: 0.05,
			yieldXS: 0.5,
			feedSubstrateGPerL: 20,
			dilutionPerH: 0.05
		};
		const without = await (
			await page.request.post('/api/v1/chemostat/steady-state', { data: base })
		).json();
		const response = await page.request.post('/api/v1/chemostat/steady-state', {
			data: { ...base, maintenanceGPerGH: 0.05 }
		});
		expect(response.status()).toBe(200);
		const body = await response.json();
		// Pirt 1965: X = D·Y_G(S0 − S)/(D + m_s·Y_G), so X/X(m_s = 0) = 0.05/(0.05 + 0.025) = 2/3 (by hand).
		expect(body.biomassGPerL / without.biomassGPerL).toBeCloseTo(2 / 3, 10);
		expect(body.criticalDilutionPerH).toBeCloseTo(without.criticalDilutionPerH, 12);
		// D_opt 0.570617 /h with maintenance (SciPy, tests/chemistry/reference/chemostat-maintenance.json).
		expect(body.optimalDilutionPerH).toBeCloseTo(0.570617, 5);
		const bad = await page.request.post('/api/v1/chemostat/steady-state', {
			data: { ...base, maintenanceGPerGH: -1 }
		});
		expect(bad.status()).toBe(400);
		expect((await bad.json()).errors[0].path).toBe('maintenanceGPerGH');
	});

	test('batch against continuous: the ratio is continuous over batch productivity, turnaround included', async ({
		page
	}) => {
		const response = await page.request.post('/api/v1/productivity/batch-vs-continuous', {
			data: {
				muMaxPerH: 0.6,
				ksGPerL: 0.05,
				yieldXS: 0.5,
				substrateGPerL: 20,
				inoculumGPerL: 0.1,
				dilutionPerH: 0.4,
				turnaround: { cleaningH: 4, sterilisingH: 3, fillingH: 1, lagH: 2 }
			}
		});
		expect(response.status()).toBe(200);
		const body = await response.json();
		expect(body.batch.turnaroundH).toBe(10);
		// Independent values: SciPy solve_ivp (Radau, rtol 1e-12) of dX/dt = μmax·S/(Ks+S)·X, dS/dt = −(1/Y)·dX/dt
		// from X0 = 0.1, S0 = 20 to S = 0.2 g/L (99 % conversion): t = 7.713280 h, X = 10.000 g/L.
		expect(body.batch.growthTimeH).toBeCloseTo(7.71328, 4);
		expect(body.batch.finalBiomassGPerL).toBeCloseTo(10.0, 6);
		expect(body.batch.cycleTimeH).toBeCloseTo(17.71328, 4);
		// Batch productivity (Xm − X0)/(t_growth + t_turnaround) = 9.9/17.71328 (from memory, the usual definition).
		expect(body.batch.productivityGPerLH).toBeCloseTo(0.558903, 5);
		// Chemostat at D = 0.4 /h: S = Ks·D/(μmax − D) = 0.1 g/L, X = Y(S0 − S) = 9.95 g/L, D·X = 3.98 g/(L·h)
		// (Monod chemostat steady state, hand-worked).
		expect(body.continuous.substrateGPerL).toBeCloseTo(0.1, 8);
		expect(body.continuous.biomassGPerL).toBeCloseTo(9.95, 8);
		expect(body.continuous.productivityGPerLH).toBeCloseTo(3.98, 8);
		expect(body.continuousToBatchRatio).toBeCloseTo(7.121096, 4);
	});

	test('fit: exponential data give back their μmax with an interval', async ({ page }) => {
		// ln X rising at 0.5 /h exactly, then a plateau: log-linear regression must return 0.5.
		const timeH = Array.from({ length: 25 }, (_, i) => i * 0.5);
		const biomassGPerL = timeH.map((t) => Math.min(0.1 * Math.exp(0.5 * t), 6));
		const response = await page.request.post('/api/v1/fit/growth', {
			data: { timeH, biomassGPerL }
		});
		expect(response.status()).toBe(200);
		const body = await response.json();
		expect(body.exponentialPhase.muMaxPerH.value).toBeCloseTo(0.5, 6);
		expect(body.exponentialPhase.doublingTimeH.value).toBeCloseTo(Math.LN2 / 0.5, 6);
		expect(body.monodFit).toBeNull();
	});

	test('scenarios: save, refuse a duplicate name, rename, delete; gone afterwards', async ({
		page
	}) => {
		const name = `API scenario ${crypto.randomUUID().slice(0, 8)}`;
		const created = await page.request.post('/api/v1/scenarios', {
			data: { name, request: fedBatch }
		});
		expect(created.status()).toBe(201);
		const scenario = await created.json();
		expect(scenario).toMatchObject({ name, mode: 'fedBatch', request: fedBatch });
		const duplicate = await page.request.post('/api/v1/scenarios', {
			data: { name, request: fedBatch }
		});
		expect(duplicate.status()).toBe(409);
		expect((await duplicate.json()).errors[0].path).toBe('name');
		const invalid = await page.request.post('/api/v1/scenarios', {
			data: { name: ' ', request: { ...fedBatch, mode: 'turbo' } }
		});
		expect((await invalid.json()).errors.map((e: { path: string }) => e.path).sort()).toEqual([
			'name',
			'request.mode'
		]);
		const renamed = await page.request.patch(`/api/v1/scenarios/${scenario.id}`, {
			data: { name: `${name} (renamed)` }
		});
		expect((await renamed.json()).name).toBe(`${name} (renamed)`);
		expect((await page.request.delete(`/api/v1/scenarios/${scenario.id}`)).status()).toBe(204);
		expect((await page.request.get(`/api/v1/scenarios/${scenario.id}`)).status()).toBe(404);
	});
});

test.describe('scenarios belong to their owner', () => {
	test.use({ role: 'media_scientist' });
	test('another person’s scenario id answers 404', async ({ page, playwright }) => {
		const engineer = await playwright.request.newContext({
			baseURL: test.info().project.use.baseURL
		});
		await engineer.post('/api/v1/session', {
			data: { email: 'engineer@demo.test', password: 'brothwright-demo' }
		});
		const created = await engineer.post('/api/v1/scenarios', {
			data: { name: `Private ${crypto.randomUUID().slice(0, 8)}`, request: fedBatch }
		});
		const { id } = await created.json();
		expect((await page.request.get(`/api/v1/scenarios/${id}`)).status()).toBe(404);
		expect((await page.request.delete(`/api/v1/scenarios/${id}`)).status()).toBe(404);
		expect((await engineer.get(`/api/v1/scenarios/${id}`)).status()).toBe(200);
		await engineer.dispose();
	});
});
