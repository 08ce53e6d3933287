import { error } from '@sveltejs/kit';
import { recordAudit } from '$lib/server/audit';
import { config } from '$lib/server/config';
import { requireActor } from '$lib/server/guard';
import { findMail, mailForReader } from '$lib/server/outbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const reader = requireActor('admin.outbox');
	const mail = findMail(params.id);
	if (!mail) error(404, { message: 'No message with this id in the outbox.' });
	const shown = mailForReader(mail, reader.email, config.seedDemo);
	recordAudit(reader, {
		action: 'outbox.read',
		subjectType: 'mail',
		subjectId: mail.id,
		detail: { subject: mail.subject, recipients: mail.recipients, linksHidden: shown.linksHidden }
	});
	return { mail: shown };
};
