import { listAuditActions, listAuditEvents } from '$lib/server/audit';
import { requirePermission } from '$lib/server/guard';
import { pageFrom } from '$lib/server/paging';
import type { PageServerLoad } from './$types';

const PAGE_SIZE = 50;

function dateParam(
	url: URL,
	name: string,
	endOfDay: boolean
): { value: string; date?: Date; error?: string } {
	const value = url.searchParams.get(name) ?? '';
	if (!value) return { value };
	const date = new Date(`${value}T${endOfDay ? '23:59:59.999' : '00:00:00'}Z`);
	if (!/^\d{4}-\d{2}-\d{2}$/.test(value) || Number.isNaN(date.getTime())) {
		return { value, error: `“${value}” is not a date (use YYYY-MM-DD); this filter is ignored.` };
	}
	return { value, date };
}

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('admin.audit');
	const page = pageFrom(url);
	const action = url.searchParams.get('action') ?? '';
	const actor = url.searchParams.get('actor') ?? '';
	const from = dateParam(url, 'from', false);
	const to = dateParam(url, 'to', true);
	const { rows, total } = listAuditEvents({
		action: action || undefined,
		actor: actor || undefined,
		from: from.date,
		to: to.date,
		page,
		pageSize: PAGE_SIZE
	});
	return {
		rows,
		total,
		page,
		pageSize: PAGE_SIZE,
		actions: listAuditActions(),
		filter: { action, actor, from: from.value, to: to.value },
		filterErrors: [from.error, to.error].filter((e): e is string => Boolean(e))
	};
};
