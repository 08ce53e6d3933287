import { endpoint } from '$lib/server/api/endpoint';

export const GET = endpoint({ act: 'workspace.view' }, ({ user, event }) => {
	const token = event.locals.apiToken;
	return {
		id: user!.id,
		email: user!.email,
		name: user!.name,
		roles: user!.roles,
		token: token
			? {
					id: token.id,
					name: token.name,
					kind: token.kind,
					scopes: token.scopes,
					expiresAt: token.expiresAt.toISOString()
				}
			: null
	};
});
