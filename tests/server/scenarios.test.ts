import { describe, expect, it } from 'vitest';
import { listAuditEvents } from '$lib/server/audit';
import type { SimulateRequest } from '$lib/server/api/operations/simulation';
import { RuleError } from '$lib/server/rule-error';
import {
	deleteScenario,
	getScenario,
	listScenarios,
	saveScenario,
	updateScenario
} from '$lib/server/scenarios';
import { makeUser } from './helpers';

const batch: SimulateRequest = {
	mode: 'batch',
	kinetics: { muMaxPerH: 0.6, ksGPerL: 0.05, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.1, substrateGPerL: 20, volumeL: 5 },
	endH: 12,
	outputEveryH: 0.5
};

async function makeOwner() {
	const person = await makeUser(['engineer']);
	return { id: person.id, email: person.email };
}

function ruleOf(run: () => unknown): RuleError {
	try {
		run();
	} catch (error) {
		if (error instanceof RuleError) return error;
		throw error;
	}
	throw new Error('no RuleError thrown');
}

describe('simulation scenarios are kept per person', () => {
	it('saves the full request and lists it only for its owner', async () => {
		const ana = await makeOwner();
		const ben = await makeOwner();
		const saved = saveScenario(ana, {
			name: '  Glucose batch ',
			notes: 'first try',
			request: batch
		});
		expect(saved.name).toBe('Glucose batch');
		expect(saved.mode).toBe('batch');
		expect(listScenarios(ana.id).map((s) => s.request)).toEqual([batch]);
		expect(listScenarios(ben.id)).toEqual([]);
		expect(ruleOf(() => getScenario(ben.id, saved.id)).status).toBe(404);
	});

	it('refuses a second scenario of the same name for the same person, not for another', async () => {
		const ana = await makeOwner();
		const ben = await makeOwner();
		saveScenario(ana, { name: 'Fed-batch A', request: batch });
		const clash = ruleOf(() => saveScenario(ana, { name: 'Fed-batch A', request: batch }));
		expect(clash.status).toBe(409);
		expect(clash.field).toBe('name');
		expect(saveScenario(ben, { name: 'Fed-batch A', request: batch }).name).toBe('Fed-batch A');
	});

	it('renames, refusing a name already taken, and nobody else can rename it', async () => {
		const ana = await makeOwner();
		const ben = await makeOwner();
		const first = saveScenario(ana, { name: 'One', request: batch });
		saveScenario(ana, { name: 'Two', request: batch });
		expect(ruleOf(() => updateScenario(ana, first.id, { name: 'Two' })).status).toBe(409);
		expect(updateScenario(ana, first.id, { name: 'Uno', notes: 'renamed' })).toMatchObject({
			name: 'Uno',
			notes: 'renamed'
		});
		expect(ruleOf(() => updateScenario(ben, first.id, { name: 'Stolen' })).status).toBe(404);
		expect(getScenario(ana.id, first.id).name).toBe('Uno');
	});

	it('deletes only the owner’s scenario and audits save and delete', async () => {
		const ana = await makeOwner();
		const ben = await makeOwner();
		const kept = saveScenario(ana, { name: 'Keep', request: batch });
		const gone = saveScenario(ana, { name: 'Drop', request: batch });
		expect(ruleOf(() => deleteScenario(ben, gone.id)).status).toBe(404);
		deleteScenario(ana, gone.id);
		expect(listScenarios(ana.id).map((s) => s.id)).toEqual([kept.id]);
		const actions = listAuditEvents({ actor: ana.email, page: 1, pageSize: 20 }).rows.map(
			(r) => r.action
		);
		expect(actions.filter((a) => a === 'simulation.scenario_saved')).toHaveLength(2);
		expect(actions).toContain('simulation.scenario_deleted');
	});
});
