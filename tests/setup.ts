import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';

// Every test file gets its own SQLite file with all migrations applied on first use.
const dir = join(process.cwd(), 'tests', '.tmp');
mkdirSync(dir, { recursive: true });
process.env.DATABASE_PATH = join(dir, `test-${randomUUID()}.db`);
process.env.SMTP_PORT ??= String(40000 + Math.floor(Math.random() * 20000));
process.env.UPLOADS_PATH = join(dir, `uploads-${randomUUID()}`);
