// `npm start` (after `vite build`): defaults for a local run, then the built server. Its `init` hook
// (src/hooks.server.ts) migrates, seeds the demo and starts the mail stand-in before it listens.
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

process.env.HOST ??= '127.0.0.1';
process.env.PORT ??= '3000';
process.env.ORIGIN ??= `http://${process.env.HOST}:${process.env.PORT}`;
// Certificates may be up to 10 MB each, several per upload; adapter-node refuses larger bodies.
process.env.BODY_SIZE_LIMIT ??= '45M';

const server = resolve('build/index.js');
if (!existsSync(server)) {
	console.error(
		'No build found at build/index.js: run `npm run build` first (npm start does this).'
	);
	process.exit(1);
}
await import(pathToFileURL(server).href);
