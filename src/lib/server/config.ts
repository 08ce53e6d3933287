import { resolve } from 'node:path';

// Read lazily so tests and the start script can set the environment before first use.
function env(name: string): string | undefined {
	const value = process.env[name];
	return value === undefined || value === '' ? undefined : value;
}

function intEnv(name: string, fallback: number): number {
	const raw = env(name);
	if (raw === undefined) return fallback;
	const value = Number(raw);
	if (!Number.isInteger(value) || value <= 0) {
		throw new Error(`${name} must be a positive whole number, got "${raw}"`);
	}
	return value;
}

export const config = {
	get databasePath() {
		return resolve(env('DATABASE_PATH') ?? './data/brothwright.db');
	},
	get migrationsFolder() {
		return resolve(env('MIGRATIONS_PATH') ?? './drizzle');
	},
	get uploadsFolder() {
		return resolve(env('UPLOADS_PATH') ?? './data/uploads');
	},
	get origin() {
		return env('ORIGIN') ?? `http://${env('HOST') ?? '127.0.0.1'}:${env('PORT') ?? '3000'}`;
	},
	get secureCookies() {
		return this.origin.startsWith('https:');
	},
	get sessionIdleHours() {
		return intEnv('SESSION_IDLE_HOURS', 8);
	},
	get smtp() {
		const host = env('SMTP_HOST');
		return {
			/** No SMTP_HOST: the stand-in server on loopback receives everything. */
			standIn: host === undefined,
			host: host ?? '127.0.0.1',
			port: intEnv('SMTP_PORT', 2525),
			user: env('SMTP_USER'),
			pass: env('SMTP_PASS'),
			from: env('MAIL_FROM') ?? 'Brothwright <no-reply@brothwright.invalid>'
		};
	},
	/** Other sites whose pages may write through the JSON API (comma-separated origins). */
	get apiClientOrigins(): string[] {
		return (env('API_CLIENT_ORIGINS') ?? '')
			.split(',')
			.map((o) => o.trim())
			.filter(Boolean);
	},
	/** Active personal API tokens one person may hold. */
	get apiTokensPerPerson() {
		return intEnv('API_TOKENS_PER_PERSON', 10);
	},
	/** Requests a minute a personal token may make; an administrator sets each service token's own. */
	get apiTokenRequestsPerMinute() {
		return intEnv('API_TOKEN_REQUESTS_PER_MINUTE', 300);
	},
	get seedDemo() {
		return env('NODE_ENV') !== 'production' || env('DEMO') === '1';
	}
};
