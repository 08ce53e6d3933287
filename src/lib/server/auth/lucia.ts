import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import { config } from '../config';
import { db } from '../db';
import { session, user } from '../db/schema';

let instance: ReturnType<typeof createLucia> | undefined;

function createLucia() {
	return new Lucia(new DrizzleSQLiteAdapter(db, session, user), {
		// Lucia extends a session once half of this span has passed, so it expires only after inactivity.
		sessionExpiresIn: new TimeSpan(config.sessionIdleHours, 'h'),
		sessionCookie: {
			name: 'brothwright_session',
			expires: true,
			attributes: { secure: config.secureCookies, sameSite: 'lax', path: '/' }
		},
		getUserAttributes: (attributes) => ({
			email: attributes.email,
			name: attributes.name,
			active: attributes.active
		})
	});
}

export function getLucia() {
	instance ??= createLucia();
	return instance;
}

declare module 'lucia' {
	interface Register {
		Lucia: ReturnType<typeof createLucia>;
		DatabaseUserAttributes: { email: string; name: string; active: boolean };
	}
}
