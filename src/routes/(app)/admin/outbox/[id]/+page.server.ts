import { error } from '@sveltejs/kit';
import { requirePermission } from '$lib/server/guard';
import { findMail } from '$lib/server/outbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('admin.outbox');
	const mail = findMail(params.id);
	if (!mail) error(404, { message: 'No message with this id in the outbox.' });
	return { mail };
};
