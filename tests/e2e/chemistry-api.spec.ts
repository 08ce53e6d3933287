import { expect, test } from './fixtures';

const AEROBIC_GLUCOSE_SPECIES = [
	{ id: 'glucose', formula: 'C6H12O6' },
	{ id: 'oxygen', formula: 'O2' },
	{ id: 'ammonia', formula: 'NH3' },
	{ id: 'biomass', formula: 'CH1.8O0.5N0.2', ashFraction: 0.05 },
	{ id: 'co2', formula: 'CO2' },
	{ id: 'water', formula: 'H2O' }
];

test.describe('science endpoints need a signed-in user', () => {
	for (const path of [
		'/api/v1/formula',
		'/api/v1/stoichiometry',
		'/api/v1/oxygen/saturation',
		'/api/v1/sufficiency'
	]) {
		test(`${path} answers 401 problem+json when signed out`, async ({ request }) => {
			const response = await request.post(path, { data: {} });
			expect(response.status()).toBe(401);
			expect(response.headers()['content-type']).toContain('application/problem+json');
		});
	}
});

test.describe('science endpoints, signed in', () => {
	test.use({ role: 'prep_technician' });

	test('formula: a hydrate read back with its molar mass', async ({ page }) => {
		const response = await page.request.post('/api/v1/formula', {
			data: { formula: 'MgSO4.7H2O' }
		});
		expect(response.status()).toBe(200);
		const body = await response.json();
		expect(body.reading).toBe('MgSO4·7H2O');
		// 246.466 g/mol from IUPAC 2021 standard atomic weights (Prohaska et al. 2022), as derived in chemistry/REFERENCES.md
		expect(body.molarMass).toBeCloseTo(246.466, 2);
		expect(body.elements).toMatchObject({ Mg: 1, S: 1, O: 11, H: 14 });
	});

	test('formula: an unknown element is a 400 naming the position', async ({ page }) => {
		const response = await page.request.post('/api/v1/formula', { data: { formula: 'NaXx2' } });
		expect(response.status()).toBe(400);
		const body = await response.json();
		expect(body.detail).toMatch(/Xx/);
		expect(body.position).toBe(2);
	});

	test('oxygen saturation at 25 °C fresh water matches the published table', async ({ page }) => {
		const response = await page.request.post('/api/v1/oxygen/saturation', {
			data: { temperatureC: 25 }
		});
		const body = await response.json();
		// 8.26 mg/L at 25 °C (ISO 5814 table; Montgomery et al. 1964), chemistry/REFERENCES.md
		expect(Math.abs(body.mgPerL - 8.26)).toBeLessThan(0.02);
		expect(body.method).toBe('benson-krause-1984');
		// Absent, the O2 fraction is dry air's, 0.20946 (composition of dry air; from memory).
		expect(body.o2MoleFraction).toBe(0.20946);
	});

	test('oxygen saturation under pure O2 scales by 1/0.20946, and a misspelt key is refused by name', async ({
		page
	}) => {
		const response = await page.request.post('/api/v1/oxygen/saturation', {
			data: { temperatureC: 37, o2MoleFraction: 1 }
		});
		expect(response.status()).toBe(200);
		const body = await response.json();
		// 6.727 mg/L for air at 37 °C (Benson & Krause 1984, chemistry/REFERENCES.md) × 1/0.20946 (Henry's law) = 32.1 mg/L.
		expect(body.mgPerL).toBeCloseTo(32.12, 1);
		expect(body.o2MoleFraction).toBe(1);
		const misspelt = await page.request.post('/api/v1/oxygen/saturation', {
			data: { temperatureC: 37, o2MoleFractin: 1 }
		});
		expect(misspelt.status()).toBe(400);
		const problem = await misspelt.json();
		expect(problem.errors[0].path).toBe('o2MoleFractin');
		expect(problem.detail).toContain('o2MoleFractin');
	});

	test('oxygen saturation outside the valid range says the range', async ({ page }) => {
		const response = await page.request.post('/api/v1/oxygen/saturation', {
			data: { temperatureC: 95 }
		});
		expect(response.status()).toBe(400);
		const body = await response.json();
		expect(body.errors[0].path).toBe('temperatureC');
		expect(body.detail).toMatch(/0.*50 °C/);
	});

	test('stoichiometry: an under-specified balance says how many more specifications are needed', async ({
		page
	}) => {
		const response = await page.request.post('/api/v1/stoichiometry', {
			data: {
				species: AEROBIC_GLUCOSE_SPECIES,
				specifications: [{ kind: 'rate', species: 'glucose', mol: -1 }]
			}
		});
		expect(response.status()).toBe(400);
		expect((await response.json()).detail).toMatch(/1 more specification/);
	});

	test('stoichiometry: a determined aerobic glucose balance closes', async ({ page }) => {
		const response = await page.request.post('/api/v1/stoichiometry', {
			data: {
				species: AEROBIC_GLUCOSE_SPECIES,
				specifications: [
					{ kind: 'rate', species: 'glucose', mol: -1 },
					{ kind: 'massYield', product: 'biomass', substrate: 'glucose', gPerG: 0.5 }
				]
			}
		});
		expect(response.status()).toBe(200);
		const body = await response.json();
		expect(body.degreesOfFreedom).toBe(2);
		expect(body.electronBalance.closes).toBe(true);
		expect(body.rates.biomass.g / 180.156).toBeCloseTo(0.5, 6);
		expect(body.rates.oxygen.mol).toBeLessThan(0);
	});

	test('sufficiency: a malformed body gives field paths', async ({ page }) => {
		const response = await page.request.post('/api/v1/sufficiency', {
			data: { profile: { kind: 'nonsense' }, target: {}, supply: { sources: [] } }
		});
		expect(response.status()).toBe(400);
		const paths = (await response.json()).errors.map((e: { path: string }) => e.path);
		expect(paths).toContain('profile.kind');
		expect(paths).toContain('supply.sources');
	});

	test('a body that is not JSON is a 400 that says so', async ({ page }) => {
		const response = await page.request.post('/api/v1/formula', {
			headers: { 'content-type': 'application/json' },
			data: Buffer.from('{"formula": ')
		});
		expect(response.status()).toBe(400);
		expect((await response.json()).detail).toMatch(/not valid JSON/);
	});
});
