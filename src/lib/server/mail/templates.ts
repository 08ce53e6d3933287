import type { OutgoingMail } from './send';

function escapeHtml(text: string): string {
	return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function layout(paragraphs: string[], link: { href: string; label: string }): string {
	const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
	return `<div style="font-family:sans-serif;max-width:36rem">${body}
<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>
<p style="color:#666;font-size:0.85em">Brothwright, upstream process workspace</p></div>`;
}

export function invitationMail(input: {
	to: string;
	inviterName: string;
	link: string;
	expiresAt: Date;
	roles: string;
}): OutgoingMail {
	const lines = [
		`${input.inviterName} has invited you to Brothwright as: ${input.roles}.`,
		`Open the link below to choose your password. It works once and expires on ${input.expiresAt.toUTCString()}.`
	];
	return {
		to: input.to,
		subject: 'Your invitation to Brothwright',
		text: `${lines.join('\n\n')}\n\n${input.link}\n`,
		html: layout(lines, { href: input.link, label: 'Accept the invitation' })
	};
}

export function passwordResetMail(input: {
	to: string;
	link: string;
	expiresAt: Date;
}): OutgoingMail {
	const lines = [
		'Someone asked to reset the password of your Brothwright account. If it was not you, ignore this message.',
		`The link below works once and expires on ${input.expiresAt.toUTCString()}.`
	];
	return {
		to: input.to,
		subject: 'Reset your Brothwright password',
		text: `${lines.join('\n\n')}\n\n${input.link}\n`,
		html: layout(lines, { href: input.link, label: 'Choose a new password' })
	};
}
