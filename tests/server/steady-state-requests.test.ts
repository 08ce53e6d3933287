import { describe, expect, it, vi } from 'vitest';
import { compareBatchWithContinuous, computeChemostatSteadyState } from '$chemistry';
import { relabelMessage } from '$lib/simulation/number-fields';
import {
	BATCH_CONTINUOUS_FIELDS,
	CHEMOSTAT_FIELDS,
	checkBatchContinuousFields,
	checkChemostatFields
} from '$lib/simulation/steady-state-requests';
import { postJson } from './endpoint-call';

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const chemostatEndpoint = await import('../../src/routes/api/v1/chemostat/steady-state/+server');
const productivityEndpoint =
	await import('../../src/routes/api/v1/productivity/batch-vs-continuous/+server');

const engineer = {
	id: 'u-engineer',
	email: 'engineer@lab.test',
	name: 'Engineer',
	roles: ['engineer']
};

/** The problem detail the endpoint answers for `body`. */
async function apiDetail(
	handler: Parameters<typeof postJson>[0],
	path: string,
	body: unknown
): Promise<string> {
	const response = await postJson(handler, path, body, { user: engineer });
	expect(response.status).toBe(400);
	return (await response.json()).detail;
}

/** What the science throws for `input`. */
function scienceMessage(compute: () => unknown): string {
	try {
		compute();
	} catch (error) {
		return (error as Error).message;
	}
	throw new Error('the science accepted the input');
}

const chemostatText = {
	muMaxPerH: '0.6',
	ksGPerL: '0.05',
	yieldXS: '0.5',
	feedSubstrateGPerL: '20',
	maintenanceGPerGH: '0',
	dilutionPerH: '0.4',
	safetyMarginPercent: '10'
};
const chemostatBody = {
	muMaxPerH: 0.6,
	ksGPerL: 0.05,
	yieldXS: 0.5,
	feedSubstrateGPerL: 20,
	maintenanceGPerGH: 0,
	dilutionPerH: 0.4,
	safetyMargin: 0.1
};

const batchText = {
	muMaxPerH: '0.6',
	ksGPerL: '0.05',
	yieldXS: '0.5',
	substrateGPerL: '20',
	maintenanceGPerGH: '0',
	inoculumGPerL: '0.1',
	dilutionPerH: '0.4',
	'turnaround.cleaningH': '4',
	'turnaround.sterilisingH': '3',
	'turnaround.fillingH': '1',
	'turnaround.lagH': '2',
	conversion: '0.99'
};
const batchBody = {
	muMaxPerH: 0.6,
	ksGPerL: 0.05,
	yieldXS: 0.5,
	substrateGPerL: 20,
	maintenanceGPerGH: 0,
	inoculumGPerL: 0.1,
	dilutionPerH: 0.4,
	turnaround: { cleaningH: 4, sterilisingH: 3, fillingH: 1, lagH: 2 },
	conversion: 0.99
};

describe('the chemostat panel checks its request with the API’s schema', () => {
	it('sends the typed numbers, the margin as a fraction', () => {
		expect(checkChemostatFields(chemostatText)).toEqual({ ok: true, request: chemostatBody });
	});

	it('refuses a negative maintenance in the API’s and the science’s words, by its label', async () => {
		const checked = checkChemostatFields({ ...chemostatText, maintenanceGPerGH: '-0.05' });
		const body = { ...chemostatBody, maintenanceGPerGH: -0.05 };
		const detail = await apiDetail(chemostatEndpoint.POST, '/api/v1/chemostat/steady-state', body);
		expect(detail).toBe(scienceMessage(() => computeChemostatSteadyState(body)));
		expect(checked).toEqual({
			ok: false,
			fieldErrors: { maintenanceGPerGH: relabelMessage(CHEMOSTAT_FIELDS, detail) }
		});
		expect(relabelMessage(CHEMOSTAT_FIELDS, detail)).toBe(
			'Maintenance m_s (g/g/h) must be at least 0 (got -0.05).'
		);
	});

	it('refuses a negative dilution rate as the API does', async () => {
		const checked = checkChemostatFields({ ...chemostatText, dilutionPerH: '-0.1' });
		const body = { ...chemostatBody, dilutionPerH: -0.1 };
		const detail = await apiDetail(chemostatEndpoint.POST, '/api/v1/chemostat/steady-state', body);
		expect(detail).toBe(scienceMessage(() => computeChemostatSteadyState(body)));
		expect(checked.ok === false && checked.fieldErrors.dilutionPerH).toBe(
			relabelMessage(CHEMOSTAT_FIELDS, detail)
		);
	});

	it('names a blank required field and a word by their labels, and reads the margin in percent', () => {
		const checked = checkChemostatFields({
			...chemostatText,
			muMaxPerH: '',
			ksGPerL: 'lots',
			safetyMarginPercent: '120'
		});
		expect(checked).toEqual({
			ok: false,
			fieldErrors: {
				muMaxPerH: 'μmax (1/h) is required.',
				ksGPerL: 'Ks (g/L): “lots” is not a number.',
				safetyMarginPercent:
					'Safety margin below D_crit (%) must be at least 0 and less than 100 (got 120).'
			}
		});
	});

	it('leaves a blank margin out, as the API allows', () => {
		const checked = checkChemostatFields({ ...chemostatText, safetyMarginPercent: ' ' });
		expect(checked.ok && 'safetyMargin' in checked.request).toBe(false);
		expect(checked.ok).toBe(true);
	});
});

describe('the batch-against-continuous panel checks its request with the API’s schema', () => {
	it('sends the typed numbers with the turnaround nested', () => {
		expect(checkBatchContinuousFields(batchText)).toEqual({ ok: true, request: batchBody });
	});

	it('refuses a conversion of 1 and a negative lag in the API’s and the science’s words', async () => {
		const checked = checkBatchContinuousFields({
			...batchText,
			conversion: '1',
			'turnaround.lagH': '-2'
		});
		const path = '/api/v1/productivity/batch-vs-continuous';
		const conversionBody = { ...batchBody, conversion: 1 };
		const lagBody = { ...batchBody, turnaround: { ...batchBody.turnaround, lagH: -2 } };
		const conversionDetail = await apiDetail(productivityEndpoint.POST, path, conversionBody);
		const lagDetail = await apiDetail(productivityEndpoint.POST, path, lagBody);
		expect(conversionDetail).toBe(scienceMessage(() => compareBatchWithContinuous(conversionBody)));
		expect(lagDetail).toBe(scienceMessage(() => compareBatchWithContinuous(lagBody)));
		expect(checked).toEqual({
			ok: false,
			fieldErrors: {
				conversion: relabelMessage(BATCH_CONTINUOUS_FIELDS, conversionDetail),
				'turnaround.lagH': relabelMessage(BATCH_CONTINUOUS_FIELDS, lagDetail)
			}
		});
		expect(checked.ok === false && checked.fieldErrors['turnaround.lagH']).toBe(
			'Lag (h) must be at least 0 (got -2).'
		);
	});

	it('lets the optional turnaround steps be blank', () => {
		const checked = checkBatchContinuousFields({ ...batchText, 'turnaround.lagH': '' });
		expect(checked.ok && checked.request.turnaround).toEqual({
			cleaningH: 4,
			sterilisingH: 3,
			fillingH: 1
		});
	});
});
