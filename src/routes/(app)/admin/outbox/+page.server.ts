import { config } from '$lib/server/config';
import { recordAudit } from '$lib/server/audit';
import { requireActor } from '$lib/server/guard';
import { listMail } from '$lib/server/outbox';
import { pageFrom } from '$lib/server/paging';
import type { PageServerLoad } from './$types';

const PAGE_SIZE = 25;

export const load: PageServerLoad = async ({ url }) => {
	const reader = requireActor('admin.outbox');
	const page = pageFrom(url);
	recordAudit(reader, { action: 'outbox.listed', subjectType: 'mail', detail: { page } });
	return { ...listMail(page, PAGE_SIZE), page, pageSize: PAGE_SIZE, standIn: config.smtp.standIn };
};
