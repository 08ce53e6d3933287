import { endpoint } from '$lib/server/api/endpoint';
import { sessionRequest } from '$lib/server/api/operations/foundation';
import { problem } from '$lib/server/api/problem';
import { setSessionCookie } from '$lib/server/auth/sessions';
import { signIn, signOut } from '$lib/server/auth/sign-in';
import { clientAddress } from '$lib/server/guard';
import { findUser, rolesOf } from '$lib/server/people';

export const POST = endpoint(
	{ act: 'session.start', body: sessionRequest },
	async ({ body, event }) => {
		const outcome = await signIn(body.email, body.password, clientAddress());
		if (!outcome.ok) {
			return problem(outcome.status, outcome.message, {
				errors: outcome.field ? [{ path: outcome.field, message: outcome.message }] : undefined,
				headers: outcome.retryAfterS ? { 'retry-after': String(outcome.retryAfterS) } : undefined
			});
		}
		const { token, session } = outcome.issued;
		setSessionCookie(event.cookies, token, session.expiresAt);
		const account = findUser(outcome.userId)!;
		return { id: account.id, email: account.email, name: account.name, roles: rolesOf(account.id) };
	}
);

export const DELETE = endpoint({ act: 'session.end' }, async ({ event, user }) => {
	if (event.locals.session) {
		await signOut(event.cookies, event.locals.session.id, {
			id: user!.id,
			email: user!.email,
			address: clientAddress()
		});
	}
	return new Response(null, { status: 204 });
});
