import { copyFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { inject } from 'vitest';

// Every test file gets its own SQLite file: a copy of the run's migrated template (global-setup.ts).
const dir = join(process.cwd(), 'tests', '.tmp');
mkdirSync(dir, { recursive: true });
process.env.DATABASE_PATH = join(dir, `test-${randomUUID()}.db`);
copyFileSync(inject('templates').emptyDatabase, process.env.DATABASE_PATH);
process.env.SMTP_PORT ??= String(40000 + Math.floor(Math.random() * 20000));
process.env.UPLOADS_PATH = join(dir, `uploads-${randomUUID()}`);
