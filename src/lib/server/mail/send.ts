import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';

export interface OutgoingMail {
	to: string | string[];
	subject: string;
	text: string;
	html?: string;
}

let transport: Transporter | undefined;

function getTransport(): Transporter {
	const smtp = config.smtp;
	transport ??= nodemailer.createTransport({
		host: smtp.host,
		port: smtp.port,
		secure: smtp.port === 465,
		// The stand-in listens on loopback without TLS; a real relay negotiates STARTTLS as usual.
		ignoreTLS: smtp.standIn,
		auth: smtp.user ? { user: smtp.user, pass: smtp.pass ?? '' } : undefined,
		connectionTimeout: 10_000
	});
	return transport;
}

/** Sends one message; resolves once the SMTP server has accepted it. */
export async function sendMail(mail: OutgoingMail): Promise<void> {
	await getTransport().sendMail({ from: config.smtp.from, ...mail });
}
