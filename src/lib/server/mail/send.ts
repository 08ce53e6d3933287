import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';
import { readStandInSecret, STAND_IN_USER } from './stand-in-secret';

export interface OutgoingMail {
	to: string | string[];
	subject: string;
	text: string;
	html?: string;
}

let relay: Transporter | undefined;

function getTransport(): Transporter {
	const smtp = config.smtp;
	if (smtp.standIn) {
		// The stand-in's secret changes each time it starts, so it is read for every message.
		return nodemailer.createTransport({
			host: smtp.host,
			port: smtp.port,
			secure: false,
			ignoreTLS: true,
			auth: { user: STAND_IN_USER, pass: readStandInSecret() ?? '' },
			connectionTimeout: 10_000
		});
	}
	relay ??= nodemailer.createTransport({
		host: smtp.host,
		port: smtp.port,
		secure: smtp.port === 465,
		auth: smtp.user ? { user: smtp.user, pass: smtp.pass ?? '' } : undefined,
		connectionTimeout: 10_000
	});
	return relay;
}

/** Sends one message; resolves once the SMTP server has accepted it. */
export async function sendMail(mail: OutgoingMail): Promise<void> {
	await getTransport().sendMail({ from: config.smtp.from, ...mail });
}
