import { sql } from 'drizzle-orm';
import { endpoint } from '$lib/server/api/endpoint';
import { problem } from '$lib/server/api/problem';
import { db } from '$lib/server/db';

export const GET = endpoint({ act: 'service.describe' }, () => {
	try {
		db.run(sql`select 1`);
	} catch (cause) {
		return problem(503, `The database does not answer: ${(cause as Error).message}`);
	}
	return { status: 'ok', database: 'ok', time: new Date().toISOString() };
});
