import { beforeAll, describe, expect, it, vi } from 'vitest';
import { findComponent, findComponentByIdOrName } from '$lib/server/components/library';
import { listProfiles, listVessels } from '$lib/server/studies/queries';
import { findProfile, findVessel } from '$lib/server/studies/record-lists';
import * as componentsApi from '../../src/routes/api/v1/components/+server';
import * as componentApi from '../../src/routes/api/v1/components/[id]/+server';
import * as profilesApi from '../../src/routes/api/v1/profiles/+server';
import * as profileApi from '../../src/routes/api/v1/profiles/[id]/+server';
import * as vesselsApi from '../../src/routes/api/v1/vessels/+server';
import * as vesselApi from '../../src/routes/api/v1/vessels/[id]/+server';
import * as newComponentPage from '../../src/routes/(app)/components/new/+page.server';
import * as componentPage from '../../src/routes/(app)/components/[id]/+page.server';
import * as newProfilePage from '../../src/routes/(app)/organisms/new/+page.server';
import * as profilePage from '../../src/routes/(app)/organisms/[id]/+page.server';
import * as newVesselPage from '../../src/routes/(app)/vessels/new/+page.server';
import * as vesselPage from '../../src/routes/(app)/vessels/[id]/+page.server';
import { makeUser } from './helpers';
import { useDemoDatabase } from './demo-database';
import {
	asForm,
	auditActionsOf,
	byNameThenId,
	callApi,
	comparable,
	expectDocumentedShape,
	expectPreconditions,
	expectSameRefusal,
	problemOf,
	savedId,
	submitPage,
	walk,
	type Person
} from './record-api-calls';

useDemoDatabase();

// The endpoints' and actions' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

let scientist: Person;
let technician: Person;

beforeAll(async () => {
	const person = await makeUser(['media_scientist', 'engineer']);
	scientist = { id: person.id, email: person.email, name: 'Scientist', roles: person.roles };
	const other = await makeUser(['prep_technician']);
	technician = { id: other.id, email: other.email, name: 'Technician', roles: other.roles };
});

const tag = () => crypto.randomUUID().slice(0, 8);

describe('components: POST, GET and PUT with the component page’s checks and audit', () => {
	const path = '/api/v1/components';
	const post = (body: unknown, user: Person | null = scientist) =>
		callApi(componentsApi.POST, 'POST', path, { user, body });
	const csCl = (name: string) => ({
		name,
		category: 'salt',
		formula: 'CsCl',
		// Caesium chloride, CAS 7647-17-8 (from memory); its check digit 8 is 118 mod 10 (by hand)
		casNumber: '7647-17-8',
		osmoticCoefficient: 0.9,
		storage: 'dry'
	});

	it('adds a component: 201 with Location and ETag, stored and audited as the page does', async () => {
		const name = `Caesium chloride ${tag()}`;
		const response = await post(csCl(name));
		const body = await response.json();
		expect(response.status, JSON.stringify(body)).toBe(201);
		expect(response.headers.get('location')).toBe(`${path}/${body.id}`);
		expect(response.headers.get('etag')).toBe('"1"');
		expectDocumentedShape('post', path, body);
		const row = findComponent(body.id);
		expect(row).toMatchObject({ name, formula: 'CsCl', osmoticCoefficient: 0.9 });
		const page = await submitPage(newComponentPage, asForm(csCl(`${name} (page)`)), {
			user: scientist
		});
		const pageRow = findComponent(savedId(page));
		expect(comparable(row)).toEqual(comparable(pageRow));
		expect(auditActionsOf('component', body.id)).toEqual(['component.created']);
		expect(auditActionsOf('component', body.id)).toEqual(auditActionsOf('component', pageRow!.id));
	});

	it('refuses what the page refuses, every field at once, in the page’s words; nothing is stored', async () => {
		const bad = {
			name: 'Sodium chloride',
			category: 'rock',
			formula: 'Xq2',
			casNumber: '7647-14-4',
			solubility: 'abc'
		};
		const problem = await expectSameRefusal(
			() => post(bad),
			() => submitPage(newComponentPage, bad, { user: scientist })
		);
		expect(problem.errors!.map((e) => e.path).sort()).toEqual(
			['casNumber', 'category', 'formula', 'name', 'solubility'].sort()
		);
		// JSON numbers are numbers; a number sent as text is read as the form reads it.
		const complex = {
			name: `Peptone ${tag()}`,
			category: 'complex',
			elementalMassFractions: 'C=0.4; N=0.1'
		};
		const numbers = await expectSameRefusal(
			() => post({ ...complex, molarMassGPerMol: -3, osmoticCoefficient: 5 }),
			() =>
				submitPage(
					newComponentPage,
					{ ...complex, molarMassGPerMol: '-3', osmoticCoefficient: '5' },
					{ user: scientist }
				)
		);
		expect(numbers.detail).toContain('Average molar mass, g/mol (no formula only)');
		expect(numbers.detail).not.toContain('molarMassGPerMol');
		await expectSameRefusal(
			() => post({ ...complex, molarMassGPerMol: '1,5' }),
			() =>
				submitPage(newComponentPage, { ...complex, molarMassGPerMol: '1,5' }, { user: scientist })
		);
		expect(findComponentByIdOrName(complex.name)).toBeUndefined();
		const unknown = await problemOf(await post({ ...csCl(`X ${tag()}`), formulae: 'x' }), 400);
		expect(unknown.errors).toEqual([expect.objectContaining({ path: 'formulae' })]);
	});

	it('reads with an ETag and replaces with If-Match, as the component page saves', async () => {
		const created = await (await post(csCl(`Caesium chloride ${tag()}`))).json();
		const params = { id: created.id };
		const read = await callApi(componentApi.GET, 'GET', `${path}/${created.id}`, {
			user: technician,
			params
		});
		expect(read.headers.get('etag')).toBe('"1"');
		expectDocumentedShape('get', `${path}/{id}`, await read.json());
		const edit = { name: created.name, category: 'salt', formula: 'CsCl', storage: 'cool' };
		const put = (body: unknown, ifMatch?: string) =>
			callApi(componentApi.PUT, 'PUT', `${path}/${created.id}`, {
				user: scientist,
				params,
				body,
				ifMatch
			});
		const saved = await put(edit, '"1"');
		const body = await saved.json();
		expect(saved.status, JSON.stringify(body)).toBe(200);
		expect(saved.headers.get('etag')).toBe('"2"');
		expectDocumentedShape('put', `${path}/{id}`, body);
		// Left out is emptied: the CAS number and φ go, as on a form sent with them blank.
		expect(findComponent(created.id)).toMatchObject({
			storage: 'cool',
			casNumber: null,
			osmoticCoefficient: null,
			revision: 2
		});
		const other = await post(csCl(`Caesium chloride ${tag()}`)).then((r) => r.json());
		const pageEdit = await submitPage(
			componentPage,
			{ ...edit, name: other.name, revision: '1' },
			{ user: scientist, params: { id: other.id } }
		);
		expect(pageEdit.kind).toBe('saved');
		expect(auditActionsOf('component', created.id)).toEqual(auditActionsOf('component', other.id));
		expect(auditActionsOf('component', created.id).at(-1)).toBe('component.updated');

		await expectSameRefusal(
			() => put({ ...edit, basisComponent: created.id }, '"2"'),
			() =>
				submitPage(
					componentPage,
					{ ...edit, name: other.name, basisComponent: other.id, revision: '2' },
					{ user: scientist, params: { id: other.id } }
				)
		);
		await expectPreconditions(
			scientist,
			componentApi.PUT,
			`${path}/${created.id}`,
			created.id,
			{ ...edit, storage: 'warm' },
			() => findComponent(created.id),
			'component'
		);
	});

	it('answers 404 for an unknown id, 403 without component.edit and 415 for a body not JSON', async () => {
		const params = { id: 'no-such-component' };
		const missing = `${path}/no-such-component`;
		const edit = csCl(`Caesium chloride ${tag()}`);
		await problemOf(
			await callApi(componentApi.GET, 'GET', missing, { user: scientist, params }),
			404
		);
		await problemOf(
			await callApi(componentApi.PUT, 'PUT', missing, {
				user: scientist,
				params,
				body: edit,
				ifMatch: '"1"'
			}),
			404
		);
		await problemOf(await post(edit, technician), 403);
		await problemOf(
			await callApi(componentApi.PUT, 'PUT', `${path}/sodium-chloride`, {
				user: technician,
				params: { id: 'sodium-chloride' },
				body: edit,
				ifMatch: '"1"'
			}),
			403
		);
		await problemOf(
			await callApi(componentsApi.POST, 'POST', path, {
				user: scientist,
				text: { type: 'text/plain', content: JSON.stringify(edit) }
			}),
			415
		);
		expect(findComponentByIdOrName(edit.name)).toBeUndefined();
	});
});

describe('organism profiles: the list, POST, GET and PUT with the profile page’s checks and audit', () => {
	const path = '/api/v1/profiles';
	const post = (body: unknown, user: Person | null = scientist) =>
		callApi(profilesApi.POST, 'POST', path, { user, body });
	const profile = (name: string) => ({
		name,
		group: 'bacterium',
		kind: 'elementalFractions',
		elementalFractions: 'C 0.48\nN 0.14\nP 0.03\nFe 0.002',
		carbonSourceId: 'd-glucose',
		yieldXSGPerG: 0.5,
		muMaxPerH: 0.5,
		ksGPerL: 0.05
	});
	const statements = {
		Fe: { role: 'required', confidence: 'measured', source: 'ICP-OES of our strain, 2025' },
		N: { confidence: 'measured' }
	};
	const statementFields = {
		'element.Fe.role': 'required',
		'element.Fe.confidence': 'measured',
		'element.Fe.source': 'ICP-OES of our strain, 2025',
		'element.N.confidence': 'measured'
	};

	it('adds a profile with its element statements: 201, stored and audited as the page does', async () => {
		const name = `API bacterium ${tag()}`;
		const response = await post({ ...profile(name), element: statements });
		const body = await response.json();
		expect(response.status, JSON.stringify(body)).toBe(201);
		expect(response.headers.get('location')).toBe(`${path}/${body.id}`);
		expect(response.headers.get('etag')).toBe('"1"');
		expectDocumentedShape('post', path, body);
		const row = findProfile(body.id);
		expect(row?.elementStatements?.Fe).toEqual(statements.Fe);
		const page = await submitPage(
			newProfilePage,
			{ ...asForm(profile(`${name} (page)`)), ...statementFields },
			{ user: scientist }
		);
		const pageRow = findProfile(savedId(page));
		expect(comparable(row)).toEqual(comparable(pageRow));
		expect(auditActionsOf('organism_profile', body.id)).toEqual(['organism_profile.created']);
		expect(auditActionsOf('organism_profile', body.id)).toEqual(
			auditActionsOf('organism_profile', pageRow!.id)
		);
	});

	it('refuses what the page refuses, at the same fields in the same words', async () => {
		const several = await expectSameRefusal(
			() =>
				post({
					name: '',
					group: 'plant',
					kind: 'elementalFractions',
					ashFraction: 0.9,
					muMaxPerH: 'fast'
				}),
			() =>
				submitPage(
					newProfilePage,
					{
						name: '',
						group: 'plant',
						kind: 'elementalFractions',
						ashFraction: '0.9',
						muMaxPerH: 'fast'
					},
					{ user: scientist }
				)
		);
		expect(several.errors!.map((e) => e.path).sort()).toEqual(
			['ashFraction', 'group', 'muMaxPerH', 'name'].sort()
		);
		const base = profile(`Refused ${tag()}`);
		const comma = { ...asForm(base), ashFraction: '0,05' };
		await expectSameRefusal(
			() => post({ ...base, ashFraction: '0,05' }),
			() => submitPage(newProfilePage, comma, { user: scientist })
		);
		// A rule of the profile: a published value needs its source.
		const unsourced = await expectSameRefusal(
			() => post({ ...base, element: { Fe: { confidence: 'confirmed' } } }),
			() =>
				submitPage(
					newProfilePage,
					{ ...asForm(base), 'element.Fe.confidence': 'confirmed' },
					{ user: scientist }
				)
		);
		expect(unsourced.errors).toEqual([expect.objectContaining({ path: 'element.Fe.source' })]);
		await expectSameRefusal(
			() => post(profile('Demo bacterium PPN-B1')),
			() =>
				submitPage(newProfilePage, asForm(profile('Demo bacterium PPN-B1')), { user: scientist }),
			409
		);
		expect(listProfiles().some((p) => p.name === base.name)).toBe(false);
	});

	it('reads with an ETag and replaces with If-Match, as the profile page saves', async () => {
		const created = await (await post(profile(`API bacterium ${tag()}`))).json();
		const params = { id: created.id };
		const read = await callApi(profileApi.GET, 'GET', `${path}/${created.id}`, {
			user: scientist,
			params
		});
		expect(read.headers.get('etag')).toBe('"1"');
		expectDocumentedShape('get', `${path}/{id}`, await read.json());
		const edit = { ...profile(created.name), muMaxPerH: 0.6, element: { Fe: { role: 'trace' } } };
		const saved = await callApi(profileApi.PUT, 'PUT', `${path}/${created.id}`, {
			user: scientist,
			params,
			body: edit,
			ifMatch: '"1"'
		});
		const body = await saved.json();
		expect(saved.status, JSON.stringify(body)).toBe(200);
		expect(saved.headers.get('etag')).toBe('"2"');
		expectDocumentedShape('put', `${path}/{id}`, body);
		expect(findProfile(created.id)).toMatchObject({ muMaxPerH: 0.6, ksGPerL: 0.05, revision: 2 });
		expect(findProfile(created.id)?.elementStatements?.Fe).toEqual({ role: 'trace' });
		const other = await (await post(profile(`API bacterium ${tag()}`))).json();
		const pageEdit = await submitPage(
			profilePage,
			{ ...asForm(profile(other.name)), muMaxPerH: '0.6', revision: '1' },
			{ user: scientist, params: { id: other.id } }
		);
		expect(pageEdit.kind).toBe('saved');
		expect(auditActionsOf('organism_profile', created.id)).toEqual(
			auditActionsOf('organism_profile', other.id)
		);
		expect(auditActionsOf('organism_profile', created.id).at(-1)).toBe('organism_profile.updated');
		await expectPreconditions(
			scientist,
			profileApi.PUT,
			`${path}/${created.id}`,
			created.id,
			{ ...edit, muMaxPerH: 0.7 },
			() => findProfile(created.id),
			'organism_profile'
		);
	});

	it('lists by cursor: every profile once, sorted by name or last change, searched by name', async () => {
		const byName = await walk(scientist, profilesApi.GET, path, 'sort=name&dir=asc');
		const all = listProfiles();
		expect(byName.total).toBe(all.length);
		expect(byName.items.map((p) => p.id)).toEqual([...all].sort(byNameThenId).map((p) => p.id));
		const byChange = await walk(scientist, profilesApi.GET, path, 'sort=updatedAt&dir=desc');
		expect(byChange.items.map((p) => p.id).sort()).toEqual(all.map((p) => p.id).sort());
		const times = byChange.items.map((p) => Date.parse(p.updatedAt));
		expect(times).toEqual([...times].sort((a, b) => b - a));
		const demo = await walk(scientist, profilesApi.GET, path, 'q=ppn');
		expect(demo.items.map((p) => p.name).sort()).toEqual(
			all
				.filter((p) => /ppn/i.test(p.name))
				.map((p) => p.name)
				.sort()
		);
		expect(demo.total).toBe(3);
		const first = await (
			await callApi(profilesApi.GET, 'GET', `${path}?limit=1`, { user: scientist })
		).json();
		const mixed = await problemOf(
			await callApi(profilesApi.GET, 'GET', `${path}?sort=updatedAt&after=${first.next}`, {
				user: scientist
			}),
			400
		);
		expect(mixed.errors).toEqual([expect.objectContaining({ path: 'after' })]);
	});

	it('answers 404 for an unknown id, 403 without study.use and 415 for a body not JSON', async () => {
		const params = { id: 'no-such-profile' };
		const missing = `${path}/no-such-profile`;
		const body = profile(`API bacterium ${tag()}`);
		await problemOf(
			await callApi(profileApi.GET, 'GET', missing, { user: scientist, params }),
			404
		);
		await problemOf(
			await callApi(profileApi.PUT, 'PUT', missing, {
				user: scientist,
				params,
				body,
				ifMatch: '"1"'
			}),
			404
		);
		const demoId = listProfiles()[0].id;
		for (const [handler, method, at] of [
			[profilesApi.GET, 'GET', path],
			[profilesApi.POST, 'POST', path],
			[profileApi.GET, 'GET', `${path}/${demoId}`],
			[profileApi.PUT, 'PUT', `${path}/${demoId}`]
		] as const) {
			const call = { user: technician, params: { id: demoId }, ifMatch: '"1"' };
			await problemOf(
				await callApi(handler, method, at, method === 'GET' ? call : { ...call, body }),
				403
			);
		}
		await problemOf(
			await callApi(profilesApi.POST, 'POST', path, {
				user: scientist,
				text: { type: 'application/x-www-form-urlencoded', content: 'name=x' }
			}),
			415
		);
		expect(listProfiles().some((p) => p.name === body.name)).toBe(false);
	});
});

describe('vessels: the list, POST, GET and PUT with the vessel page’s checks and audit', () => {
	const path = '/api/v1/vessels';
	const post = (body: unknown, user: Person | null = scientist) =>
		callApi(vesselsApi.POST, 'POST', path, { user, body });
	const tank = (name: string) => ({
		name,
		minWorkingVolumeL: 1,
		maxWorkingVolumeL: 10,
		kLaMode: 'entered',
		kLaPerH: 150,
		maxGasFlowVvm: 1.5,
		o2EnrichmentAllowed: true,
		maxPressureKPa: 200,
		temperatureC: 30,
		coolingCapacityW: 500,
		impellerCount: 2
	});

	it('adds a vessel: 201 with Location and ETag, stored and audited as the page does', async () => {
		const name = `API tank ${tag()}`;
		const response = await post(tank(name));
		const body = await response.json();
		expect(response.status, JSON.stringify(body)).toBe(201);
		expect(response.headers.get('location')).toBe(`${path}/${body.id}`);
		expect(response.headers.get('etag')).toBe('"1"');
		expectDocumentedShape('post', path, body);
		const row = findVessel(body.id);
		expect(row).toMatchObject({ name, o2EnrichmentAllowed: true, impellerCount: 2 });
		const page = await submitPage(newVesselPage, asForm(tank(`${name} (page)`)), {
			user: scientist
		});
		const pageRow = findVessel(savedId(page));
		expect(comparable(row)).toEqual(comparable(pageRow));
		expect(auditActionsOf('vessel', body.id)).toEqual(['vessel.created']);
		expect(auditActionsOf('vessel', body.id)).toEqual(auditActionsOf('vessel', pageRow!.id));
	});

	it('refuses what the page refuses, at the same fields in the same words', async () => {
		const bad = { ...tank(''), minWorkingVolumeL: 0, temperatureC: 500, impellerCount: 1.5 };
		const several = await expectSameRefusal(
			() => post(bad),
			() => submitPage(newVesselPage, asForm(bad), { user: scientist })
		);
		expect(several.errors!.map((e) => e.path).sort()).toEqual(
			['impellerCount', 'minWorkingVolumeL', 'name', 'temperatureC'].sort()
		);
		expect(several.detail).toContain('Temperature must be at most');
		// A rule across fields, and a number sent as text read by the site's decimal mark.
		const name = `Refused tank ${tag()}`;
		const inverted = { ...tank(name), minWorkingVolumeL: 20 };
		await expectSameRefusal(
			() => post(inverted),
			() => submitPage(newVesselPage, asForm(inverted), { user: scientist })
		);
		const comma = { ...tank(name), kLaPerH: '150,5' };
		await expectSameRefusal(
			() => post(comma),
			() => submitPage(newVesselPage, asForm(comma), { user: scientist })
		);
		await expectSameRefusal(
			() => post(tank('Pilot vessel PV-200')),
			() => submitPage(newVesselPage, asForm(tank('Pilot vessel PV-200')), { user: scientist }),
			409
		);
		const unknown = await problemOf(await post({ ...tank(name), kla: 150 }), 400);
		expect(unknown.errors).toEqual([expect.objectContaining({ path: 'kla' })]);
		expect(listVessels().some((v) => v.name === name)).toBe(false);
	});

	it('reads with an ETag and replaces with If-Match, as the vessel page saves', async () => {
		const created = await (await post(tank(`API tank ${tag()}`))).json();
		const params = { id: created.id };
		const read = await callApi(vesselApi.GET, 'GET', `${path}/${created.id}`, {
			user: scientist,
			params
		});
		expect(read.headers.get('etag')).toBe('"1"');
		expectDocumentedShape('get', `${path}/{id}`, await read.json());
		const edit = { ...tank(created.name), coolingCapacityW: 800, o2EnrichmentAllowed: false };
		const saved = await callApi(vesselApi.PUT, 'PUT', `${path}/${created.id}`, {
			user: scientist,
			params,
			body: edit,
			ifMatch: '"1"'
		});
		const body = await saved.json();
		expect(saved.status, JSON.stringify(body)).toBe(200);
		expect(saved.headers.get('etag')).toBe('"2"');
		expectDocumentedShape('put', `${path}/{id}`, body);
		expect(findVessel(created.id)).toMatchObject({
			coolingCapacityW: 800,
			o2EnrichmentAllowed: false,
			revision: 2
		});
		const other = await (await post(tank(`API tank ${tag()}`))).json();
		const pageEdit = await submitPage(
			vesselPage,
			{ ...asForm(tank(other.name)), coolingCapacityW: '800', revision: '1' },
			{ user: scientist, params: { id: other.id } }
		);
		expect(pageEdit.kind).toBe('saved');
		expect(auditActionsOf('vessel', created.id)).toEqual(auditActionsOf('vessel', other.id));
		expect(auditActionsOf('vessel', created.id).at(-1)).toBe('vessel.updated');
		await expectPreconditions(
			scientist,
			vesselApi.PUT,
			`${path}/${created.id}`,
			created.id,
			{ ...edit, coolingCapacityW: 900 },
			() => findVessel(created.id),
			'vessel'
		);
	});

	it('lists by cursor: every vessel once, sorted by name or last change, searched by name', async () => {
		const all = listVessels();
		const byName = await walk(scientist, vesselsApi.GET, path, 'sort=name&dir=desc');
		expect(byName.total).toBe(all.length);
		expect(byName.items.map((v) => v.id)).toEqual(
			[...all]
				.sort(byNameThenId)
				.reverse()
				.map((v) => v.id)
		);
		const byChange = await walk(scientist, vesselsApi.GET, path, 'sort=updatedAt&dir=asc');
		const times = byChange.items.map((v) => Date.parse(v.updatedAt));
		expect(times).toEqual([...times].sort((a, b) => a - b));
		expect(byChange.items).toHaveLength(all.length);
		const pilot = await walk(scientist, vesselsApi.GET, path, 'q=PV-2');
		expect(pilot.items.map((v) => v.name)).toEqual(['Pilot vessel PV-200']);
	});

	it('answers 404 for an unknown id, 403 without study.use and 415 for a body not JSON', async () => {
		const params = { id: 'no-such-vessel' };
		const missing = `${path}/no-such-vessel`;
		const body = tank(`API tank ${tag()}`);
		await problemOf(await callApi(vesselApi.GET, 'GET', missing, { user: scientist, params }), 404);
		await problemOf(
			await callApi(vesselApi.PUT, 'PUT', missing, { user: scientist, params, body, ifMatch: '*' }),
			404
		);
		const demoId = listVessels()[0].id;
		for (const [handler, method, at] of [
			[vesselsApi.GET, 'GET', path],
			[vesselsApi.POST, 'POST', path],
			[vesselApi.GET, 'GET', `${path}/${demoId}`],
			[vesselApi.PUT, 'PUT', `${path}/${demoId}`]
		] as const) {
			const call = { user: technician, params: { id: demoId }, ifMatch: '"1"' };
			await problemOf(
				await callApi(handler, method, at, method === 'GET' ? call : { ...call, body }),
				403
			);
		}
		await problemOf(
			await callApi(vesselApi.PUT, 'PUT', `${path}/${demoId}`, {
				user: scientist,
				params: { id: demoId },
				ifMatch: '*',
				text: { type: 'text/plain', content: JSON.stringify(body) }
			}),
			415
		);
		expect(listVessels().some((v) => v.name === body.name)).toBe(false);
	});
});
