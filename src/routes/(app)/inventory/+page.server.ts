import { readGramsText } from '$lib/quantities';
import { RuleError } from '$lib/server/rule-error';
import { optionalNumber } from '$lib/server/studies/fields';
import { z } from 'zod';
import { DEFAULT_EXPIRY_WINDOW_DAYS } from '$lib/inventory';
import { tagged } from '$lib/server/form-tag';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { clientAddress, requirePermission } from '$lib/server/guard';
import {
	componentsBelowReorder,
	componentsWithStockSettings,
	EXPIRING_COUNTED_UP_TO,
	expiringLots,
	quarantinedLots
} from '$lib/server/inventory/alerts';
import {
	lastDigestDate,
	MailUnreachableError,
	sendInventoryDigest
} from '$lib/server/inventory/digest';
import { setStockSettings } from '$lib/server/inventory/stock-settings';
import type { Actions, PageServerLoad } from './$types';

const settingsForm = z.object({
	componentId: z.string().min(1, 'Choose a component.'),
	reorderLevel: z.string().trim().default(''),
	densityGPerMl: optionalNumber('Density (g/mL, liquids)')
});

/** The reorder level typed in any documented unit, as grams; a volume uses the density given. */
function reorderLevelGrams(text: string, densityGPerMl: number | null): number | null {
	if (text === '') return null;
	const read = readGramsText(text, 'Reorder level', densityGPerMl);
	if (!read.ok) throw new RuleError(read.message, { field: 'reorderLevel' });
	return read.grams;
}

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('inventory.manage');
	const requested = Number(url.searchParams.get('days') ?? DEFAULT_EXPIRY_WINDOW_DAYS);
	const days =
		Number.isInteger(requested) && requested >= 1 && requested <= 730
			? requested
			: DEFAULT_EXPIRY_WINDOW_DAYS;
	return {
		days,
		daysRefused: url.searchParams.has('days') && days !== requested,
		expiring: expiringLots(days, undefined, undefined, { countUpTo: EXPIRING_COUNTED_UP_TO }),
		low: componentsBelowReorder(),
		quarantined: quarantinedLots(),
		components: componentsWithStockSettings(),
		lastDigest: lastDigestDate()
	};
};

export const actions: Actions = {
	settings: async ({ request }) =>
		tagged('settings', async () => {
			const user = requirePermission('inventory.manage');
			const formData = await request.formData();
			const parsed = parseForm(settingsForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				const { componentId, reorderLevel, densityGPerMl } = parsed.data;
				setStockSettings(
					{ id: user.id, email: user.email, address: clientAddress() },
					componentId,
					{
						reorderLevelG: reorderLevelGrams(reorderLevel, densityGPerMl),
						densityGPerMl
					}
				);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Stock settings saved.' };
		}),
	digest: async () => {
		requirePermission('inventory.manage');
		try {
			const { recipients } = await sendInventoryDigest();
			return {
				saved: recipients.length
					? `Digest sent to ${recipients.join(', ')}.`
					: 'No active inventory lead to send the digest to.'
			};
		} catch (cause) {
			if (cause instanceof MailUnreachableError) return { mailError: cause.message };
			throw cause;
		}
	}
};
