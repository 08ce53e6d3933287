// Once per vitest run: a migrated empty database and a demo database, each a template that test
// files copy instead of migrating (every file) or seeding the demo (argon2 hashes, hundreds of
// writes) themselves. tests/setup.ts copies the empty one; `useDemoDatabase()` the demo one.
import { mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';

export interface DatabaseTemplates {
	emptyDatabase: string;
	demoDatabase: string;
	demoUploads: string;
}

declare module 'vitest' {
	export interface ProvidedContext {
		templates: DatabaseTemplates;
	}
}

export default async function setup(project: TestProject) {
	const dir = join(process.cwd(), 'tests', '.tmp', `templates-${process.pid}`);
	mkdirSync(dir, { recursive: true });
	const templates: DatabaseTemplates = {
		emptyDatabase: join(dir, 'empty.db'),
		demoDatabase: join(dir, 'demo.db'),
		demoUploads: join(dir, 'demo-uploads')
	};
	const { openDatabase } = await import('../src/lib/server/db/index');
	closeCheckpointed(openDatabase(templates.emptyDatabase));
	process.env.DATABASE_PATH = templates.demoDatabase;
	process.env.UPLOADS_PATH = templates.demoUploads;
	const { getDb } = await import('../src/lib/server/db/index');
	const { seedDemo } = await import('../src/lib/server/demo/seed');
	await seedDemo();
	closeCheckpointed(getDb());
	project.provide('templates', templates);
	return () => rmSync(dir, { recursive: true, force: true });
}

/** Folds the write-ahead log into the file and closes it, so a plain file copy is the whole database. */
function closeCheckpointed(db: { $client: { pragma: (s: string) => unknown; close: () => void } }) {
	db.$client.pragma('wal_checkpoint(TRUNCATE)');
	db.$client.pragma('journal_mode = DELETE');
	db.$client.close();
}
