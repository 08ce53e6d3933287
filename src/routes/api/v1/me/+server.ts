import { endpoint } from '$lib/server/api/endpoint';

export const GET = endpoint({ act: 'workspace.view' }, ({ user }) => ({
	id: user!.id,
	email: user!.email,
	name: user!.name,
	roles: user!.roles
}));
