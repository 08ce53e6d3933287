import { requirePermission } from '$lib/server/guard';
import { siteTimeZone } from '$lib/server/site-time-zone';
import { siteDecimalMark } from '$lib/number-reading';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async () => {
	const user = requirePermission('workspace.view');
	return { user, siteTimeZone: siteTimeZone(), decimalMark: siteDecimalMark() };
};
