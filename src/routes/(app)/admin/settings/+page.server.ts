import { z } from 'zod';
import {
	batchNumberPattern,
	formatBatchNumber,
	setBatchNumberPattern
} from '$lib/server/batches/numbering';
import { config } from '$lib/server/config';
import { tagged } from '$lib/server/form-tag';
import { formFailure, formText, parseForm, ruleFailure } from '$lib/server/forms';
import { receiverMayNotSign, setReceiverMayNotSign } from '$lib/server/inventory/lot-settings';
import { hardBandPercent, setHardBandPercent } from '$lib/server/batches/weighing-band';
import { clientAddress, requirePermission } from '$lib/server/guard';
import { sessionAbsoluteDays, setSessionAbsoluteDays } from '$lib/server/auth/session-settings';
import {
	setSimulationTimeLimitS,
	simulationTimeLimitS,
	SIMULATION_TIME_LIMIT_LABEL,
	SIMULATION_TIME_LIMIT_RANGE_S
} from '$lib/server/simulation-settings';
import { setSiteTimeZone, siteTimeZone, SITE_TIME_ZONE_LABEL } from '$lib/server/site-time-zone';
import {
	setStoredDecimalMark,
	storedDecimalMark,
	SITE_DECIMAL_MARK_LABEL
} from '$lib/server/site-decimal-mark';
import { DECIMAL_MARK_LABELS } from '$lib/number-reading';
import type { Actions, PageServerLoad } from './$types';

const patternForm = z.object({ pattern: z.string().max(60) });
const lotSigningForm = z.object({ receiverMayNotSign: z.string().optional() });
const hardBandForm = z.object({ hardBandPercent: z.string().default('') });
const sessionLimitForm = z.object({ sessionAbsoluteDays: z.string().default('') });
const simulationLimitForm = z.object({ simulationTimeLimitS: formText });
const timeZoneForm = z.object({ siteTimeZone: formText });
const decimalMarkForm = z.object({ decimalMark: formText });

export const load: PageServerLoad = async () => {
	requirePermission('admin.settings');
	const pattern = batchNumberPattern();
	return {
		pattern,
		example: formatBatchNumber(pattern, new Date(), 1),
		receiverMayNotSign: receiverMayNotSign(),
		hardBandPercent: hardBandPercent(),
		sessionAbsoluteDays: sessionAbsoluteDays(),
		sessionIdleHours: config.sessionIdleHours,
		timeZone: {
			name: siteTimeZone(),
			label: SITE_TIME_ZONE_LABEL,
			known: Intl.supportedValuesOf('timeZone')
		},
		decimalMarkSetting: {
			mark: storedDecimalMark(),
			label: SITE_DECIMAL_MARK_LABEL,
			choices: DECIMAL_MARK_LABELS
		},
		simulationTimeLimit: {
			seconds: simulationTimeLimitS(),
			label: SIMULATION_TIME_LIMIT_LABEL,
			rangeS: SIMULATION_TIME_LIMIT_RANGE_S
		}
	};
};

export const actions: Actions = {
	pattern: async ({ request }) => {
		const admin = requirePermission('admin.settings');
		const formData = await request.formData();
		const parsed = parseForm(patternForm, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			setBatchNumberPattern(
				{ id: admin.id, email: admin.email, address: clientAddress() },
				parsed.data.pattern
			);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return {
			saved: `Saved. The next batch number will look like ${formatBatchNumber(parsed.data.pattern.trim(), new Date(), 1)}.`
		};
	},
	hardBand: async ({ request }) =>
		tagged('hardBand', async () => {
			const admin = requirePermission('admin.settings');
			const formData = await request.formData();
			const parsed = parseForm(hardBandForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				setHardBandPercent(
					{ id: admin.id, email: admin.email, address: clientAddress() },
					parsed.data.hardBandPercent
				);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return {
				form: 'hardBand',
				saved: `Saved. Beyond ±${Number(parsed.data.hardBandPercent.trim())} % of what a line needs, a weighing needs a witness.`
			};
		}),
	sessionLimit: async ({ request }) =>
		tagged('sessionLimit', async () => {
			const admin = requirePermission('admin.settings');
			const formData = await request.formData();
			const parsed = parseForm(sessionLimitForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				setSessionAbsoluteDays(
					{ id: admin.id, email: admin.email, address: clientAddress() },
					parsed.data.sessionAbsoluteDays
				);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return {
				form: 'sessionLimit',
				saved: `Saved. A session now ends ${sessionAbsoluteDays()} days after sign-in at the latest.`
			};
		}),
	simulationLimit: async ({ request }) =>
		tagged('simulationLimit', async () => {
			const admin = requirePermission('admin.settings');
			const formData = await request.formData();
			const parsed = parseForm(simulationLimitForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				setSimulationTimeLimitS(
					{ id: admin.id, email: admin.email, address: clientAddress() },
					parsed.data.simulationTimeLimitS
				);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return {
				form: 'simulationLimit',
				saved: `Saved. A simulation, fit or study evaluation running longer than ${simulationTimeLimitS()} s is now stopped.`
			};
		}),
	timeZone: async ({ request }) =>
		tagged('timeZone', async () => {
			const admin = requirePermission('admin.settings');
			const formData = await request.formData();
			const parsed = parseForm(timeZoneForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				setSiteTimeZone(
					{ id: admin.id, email: admin.email, address: clientAddress() },
					parsed.data.siteTimeZone
				);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return {
				form: 'timeZone',
				saved: `Saved. Dates and times are now shown in ${siteTimeZone()}.`
			};
		}),
	decimalMark: async ({ request }) =>
		tagged('decimalMark', async () => {
			const admin = requirePermission('admin.settings');
			const formData = await request.formData();
			const parsed = parseForm(decimalMarkForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				setStoredDecimalMark(
					{ id: admin.id, email: admin.email, address: clientAddress() },
					parsed.data.decimalMark
				);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return {
				form: 'decimalMark',
				saved: `Saved. Numbers are now read with a decimal ${storedDecimalMark()}.`
			};
		}),
	lotSigning: async ({ request }) =>
		tagged('lotSigning', async () => {
			const admin = requirePermission('admin.settings');
			const formData = await request.formData();
			const parsed = parseForm(lotSigningForm, formData);
			if (!parsed.ok) return parsed.failure;
			const value = parsed.data.receiverMayNotSign;
			if (value !== undefined && value !== 'on')
				return formFailure(
					formData,
					'A lot’s receiver may not release or reject it: tick or untick the box.',
					{ receiverMayNotSign: ['Tick or untick the box.'] }
				);
			const on = value === 'on';
			setReceiverMayNotSign({ id: admin.id, email: admin.email, address: clientAddress() }, on);
			return {
				form: 'lotSigning',
				saved: on
					? 'Saved. Someone other than the receiver must release or reject a lot.'
					: 'Saved. The receiver of a lot may now release or reject it too.'
			};
		})
};
