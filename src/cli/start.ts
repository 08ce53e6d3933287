// `npm start`: migrate, seed the demo once, start the mail stand-in, then serve the built app.
import { existsSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

process.env.HOST ??= '127.0.0.1';
process.env.PORT ??= '3000';
process.env.ORIGIN ??= `http://${process.env.HOST}:${process.env.PORT}`;
// Certificates may be up to 10 MB each, several per upload; adapter-node refuses larger bodies.
process.env.BODY_SIZE_LIMIT ??= '45M';

const { config } = await import('../lib/server/config');

if (process.env.RESET_DATABASE === '1') {
	// Used by the browser tests: every run starts from an empty file.
	for (const suffix of ['', '-wal', '-shm']) rmSync(config.databasePath + suffix, { force: true });
}

const { getDb } = await import('../lib/server/db');
getDb();
console.log(`Database ready at ${config.databasePath}`);

{
	const { seedReferenceLibrary } = await import('../lib/server/components/reference-library');
	const added = seedReferenceLibrary();
	console.log(added ? `Component library: loaded ${added} reference components.` : 'Component library: already loaded.');
}

if (config.seedDemo) {
	const { seedDemo } = await import('../lib/server/demo/seed');
	const added = await seedDemo();
	console.log(added ? `Demo data: added ${added} records.` : 'Demo data: already present, nothing changed.');
}

if (config.smtp.standIn) {
	const { startMailStandIn } = await import('../lib/server/mail/stand-in');
	try {
		const standIn = await startMailStandIn(config.smtp.port);
		// adapter-node closes its HTTP server on SIGINT/SIGTERM and then waits for the event loop to empty;
		// the open SMTP listener would keep it alive, so close it on the same signals.
		for (const signal of ['SIGINT', 'SIGTERM'] as const) {
			process.once(signal, () => standIn.close(() => undefined));
		}
	} catch (cause) {
		const code = (cause as NodeJS.ErrnoException).code;
		console.error(
			code === 'EADDRINUSE'
				? `Port ${config.smtp.port} for the mail stand-in is taken: stop what uses it, or set SMTP_PORT to a free port.`
				: `The mail stand-in could not start: ${(cause as Error).message}`
		);
		process.exit(1);
	}
	console.log(`Mail stand-in listening on 127.0.0.1:${config.smtp.port}; read it at ${config.origin}/admin/outbox`);
} else {
	console.log(`Mail goes to ${config.smtp.host}:${config.smtp.port}`);
}

{
	// The inventory digest: checked hourly, sent once a day (the date sent is kept in site_setting).
	const { MailUnreachableError, sendDigestIfDue } = await import('../lib/server/inventory/digest');
	const check = () =>
		sendDigestIfDue().then(
			(sent) => sent && console.log('Inventory digest sent.'),
			(cause) => console.error(`Inventory digest not sent: ${cause instanceof MailUnreachableError ? cause.message : (cause as Error).message}`)
		);
	const timer = setInterval(check, 60 * 60 * 1000);
	timer.unref();
	for (const signal of ['SIGINT', 'SIGTERM'] as const) process.once(signal, () => clearInterval(timer));
	if (process.env.NODE_ENV !== 'test') void check();
}

const server = resolve('build/index.js');
if (!existsSync(server)) {
	console.error('No build found at build/index.js: run `npm run build` first (npm start does this).');
	process.exit(1);
}
await import(pathToFileURL(server).href);

console.log(`\nBrothwright is serving at ${config.origin}`);
if (config.seedDemo) {
	const { DEMO_ACCOUNTS, DEMO_PASSWORD } = await import('../lib/server/demo/accounts');
	console.log(`Demo sign-ins (password ${DEMO_PASSWORD}):`);
	for (const a of DEMO_ACCOUNTS) console.log(`  ${a.email.padEnd(24)} ${a.roles.join(', ')}`);
}
