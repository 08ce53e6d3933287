import { copyFileSync, cpSync, existsSync } from 'node:fs';
import { inject } from 'vitest';

/**
 * Makes this test file's database a copy of the demo (seeded once per run in global-setup.ts), its
 * uploads too. Call at the top of the file, after the imports, before anything opens the database.
 */
export function useDemoDatabase(): void {
	const path = process.env.DATABASE_PATH!;
	// Opened in WAL mode, the database has its shared-memory file beside it: copying over it now
	// would pull the file from under an open connection.
	if (existsSync(`${path}-shm`))
		throw new Error('useDemoDatabase() must run before anything opens the database.');
	const { demoDatabase, demoUploads } = inject('templates');
	copyFileSync(demoDatabase, path);
	if (existsSync(demoUploads)) cpSync(demoUploads, process.env.UPLOADS_PATH!, { recursive: true });
}
