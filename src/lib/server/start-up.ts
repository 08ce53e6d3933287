// What the server does once before it serves: run from the `init` hook in src/hooks.server.ts, so
// `node build` (adapter-node) migrates, seeds and starts mail on its own; `npm start` only adds local defaults.
import { rmSync } from 'node:fs';
import { config } from './config';
import { seedReferenceLibrary } from './components/reference-library';
import { getDb } from './db';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo/accounts';
import { seedDemo } from './demo/seed';
import { MailUnreachableError, sendDigestIfDue } from './inventory/digest';
import { startMailStandIn } from './mail/stand-in';
import { startSimulationPool } from './simulation-pool';

const DIGEST_CHECK_INTERVAL_MS = 60 * 60 * 1000;

export async function startServer(): Promise<void> {
	if (process.env.RESET_DATABASE === '1') {
		// Used by the browser tests: every run starts from an empty file.
		for (const suffix of ['', '-wal', '-shm'])
			rmSync(config.databasePath + suffix, { force: true });
	}

	getDb();
	console.log(`Database ready at ${config.databasePath}`);

	const referenceComponentsAdded = seedReferenceLibrary();
	console.log(
		referenceComponentsAdded
			? `Component library: loaded ${referenceComponentsAdded} reference components.`
			: 'Component library: already loaded.'
	);

	// Before the demo, which evaluates its studies in the pool: the threads load the science meanwhile.
	const threads = startSimulationPool();
	console.log(`Simulation pool: ${threads} worker thread${threads === 1 ? '' : 's'}.`);

	if (config.seedDemo) {
		const added = await seedDemo();
		console.log(
			added ? `Demo data: added ${added} records.` : 'Demo data: already present, nothing changed.'
		);
	}

	await startMail();
	startDigestTimer();

	if (config.seedDemo) {
		console.log(`Demo sign-ins at ${config.origin} (password ${DEMO_PASSWORD}):`);
		for (const account of DEMO_ACCOUNTS)
			console.log(`  ${account.email.padEnd(24)} ${account.roles.join(', ')}`);
	}
}

async function startMail(): Promise<void> {
	if (!config.smtp.standIn) {
		console.log(`Mail goes to ${config.smtp.host}:${config.smtp.port}`);
		return;
	}
	try {
		const standIn = await startMailStandIn(config.smtp.port);
		// adapter-node closes its HTTP server on SIGINT/SIGTERM, then waits for the event loop to empty;
		// the open SMTP listener would keep the process alive, so it closes on the same signal.
		process.once('sveltekit:shutdown', () => standIn.close(() => undefined));
	} catch (cause) {
		const code = (cause as NodeJS.ErrnoException).code;
		console.error(
			code === 'EADDRINUSE'
				? `Port ${config.smtp.port} for the mail stand-in is taken: stop what uses it, or set SMTP_PORT to a free port.`
				: `The mail stand-in could not start: ${(cause as Error).message}`
		);
		process.exit(1);
	}
	console.log(
		`Mail stand-in listening on 127.0.0.1:${config.smtp.port}; read it at ${config.origin}/admin/outbox`
	);
}

/** The inventory digest: checked hourly, sent once a day (the date sent is kept in site_setting). */
function startDigestTimer(): void {
	const check = () =>
		sendDigestIfDue().then(
			(sent) => sent && console.log('Inventory digest sent.'),
			(cause) =>
				console.error(
					`Inventory digest not sent: ${cause instanceof MailUnreachableError ? cause.message : (cause as Error).message}`
				)
		);
	const timer = setInterval(check, DIGEST_CHECK_INTERVAL_MS);
	timer.unref();
	process.once('sveltekit:shutdown', () => clearInterval(timer));
	if (process.env.NODE_ENV !== 'test') void check();
}
