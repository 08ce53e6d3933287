import { config } from '$lib/server/config';
import { requirePermission } from '$lib/server/guard';
import { listMail } from '$lib/server/outbox';
import { pageFrom } from '$lib/server/paging';
import type { PageServerLoad } from './$types';

const PAGE_SIZE = 25;

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('admin.outbox');
	const page = pageFrom(url);
	return { ...listMail(page, PAGE_SIZE), page, pageSize: PAGE_SIZE, standIn: config.smtp.standIn };
};
