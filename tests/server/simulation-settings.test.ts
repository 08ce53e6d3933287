import { eq } from 'drizzle-orm';
import { describe, expect, it, vi } from 'vitest';
import { db } from '$lib/server/db';
import { auditEvent } from '$lib/server/db/schema';
import {
	DEFAULT_SIMULATION_TIME_LIMIT_S,
	setSimulationTimeLimitS,
	simulationTimeLimitS
} from '$lib/server/simulation-settings';
import { describeAction } from '$lib/server/trail/describe';
import { enterEvent } from './endpoint-call';
import { makeUser, refusalOf } from './helpers';

// The page's guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const settingsPage = await import('../../src/routes/(app)/admin/settings/+page.server');

async function submitLimit(text: string) {
	const admin = await makeUser(['admin']);
	const user = { id: admin.id, email: admin.email, name: 'Admin', roles: ['admin'] };
	const body = new FormData();
	body.set('simulationTimeLimitS', text);
	const request = new Request('http://127.0.0.1/admin/settings?/simulationLimit', {
		method: 'POST',
		body
	});
	const event = enterEvent(request, { user });
	return { admin, answer: await settingsPage.actions.simulationLimit(event as never) };
}

describe('the time limit per simulation run', () => {
	it('is 10 s until an administrator sets it', () => {
		expect(DEFAULT_SIMULATION_TIME_LIMIT_S).toBe(10);
		expect(simulationTimeLimitS()).toBe(10);
	});

	it('refuses what is not a number of seconds from 0.1 to 600, naming the field by its label', async () => {
		const admin = await makeUser(['admin']);
		const refusals: [string, string][] = [
			['0.05', 'Time limit per run (s) must be from 0.1 to 600 seconds (got 0.05).'],
			['601', 'Time limit per run (s) must be from 0.1 to 600 seconds (got 601).'],
			['-1', 'Time limit per run (s) must be from 0.1 to 600 seconds (got -1).'],
			['ten', 'Time limit per run (s): “ten” is not a number.'],
			['', 'Time limit per run (s): enter a number.'],
			[
				'1,500',
				'Time limit per run (s): “1,500” is ambiguous: it could be 1.5 or 1500. This site writes decimals with a point and no thousands separator: type 1500 or 1.5.'
			]
		];
		for (const [text, message] of refusals) {
			const refusal = await refusalOf(() => setSimulationTimeLimitS(admin, text));
			expect(refusal.message).toBe(message);
			expect(refusal.field).toBe('simulationTimeLimitS');
		}
		expect(simulationTimeLimitS()).toBe(DEFAULT_SIMULATION_TIME_LIMIT_S);
	});

	it('saves a good value, audits the change and reads it in the trail', async () => {
		const admin = await makeUser(['admin']);
		setSimulationTimeLimitS(admin, ' 2.5 ');
		try {
			expect(simulationTimeLimitS()).toBe(2.5);
			const audited = db
				.select()
				.from(auditEvent)
				.where(eq(auditEvent.action, 'settings.simulation_time_limit_s'))
				.all()
				.find((e) => e.actorId === admin.id);
			expect(audited?.detail).toEqual({ from: 10, to: 2.5 });
			expect(describeAction(audited!.action, audited!.detail as never, 'site')).toBe(
				'Changed the time limit per simulation run from 10 s to 2.5 s'
			);
		} finally {
			setSimulationTimeLimitS(admin, String(DEFAULT_SIMULATION_TIME_LIMIT_S));
		}
	});
});

describe('the settings page’s time limit form', () => {
	it('refuses a bad value at the field, keeping what was typed', async () => {
		const { answer } = await submitLimit('3 min');
		expect(answer).toMatchObject({
			status: 400,
			data: {
				form: 'simulationLimit',
				fieldErrors: {
					simulationTimeLimitS: ['Time limit per run (s): “3 min” is not a number.']
				},
				values: { simulationTimeLimitS: '3 min' }
			}
		});
		expect(simulationTimeLimitS()).toBe(DEFAULT_SIMULATION_TIME_LIMIT_S);
	});

	it('saves a good value and says what it now means', async () => {
		const { admin, answer } = await submitLimit('30');
		try {
			expect(answer).toEqual({
				form: 'simulationLimit',
				saved:
					'Saved. A simulation, fit or study evaluation running longer than 30 s is now stopped.'
			});
			expect(simulationTimeLimitS()).toBe(30);
		} finally {
			setSimulationTimeLimitS(admin, String(DEFAULT_SIMULATION_TIME_LIMIT_S));
		}
	});
});
