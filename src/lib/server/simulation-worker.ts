// What a pool thread runs (see simulation-pool.ts). Bundled on its own with `$chemistry` by
// src/vite/simulation-worker-plugin.ts, so it imports nothing that needs the server or SvelteKit.
import type { MessagePort } from 'node:worker_threads';
import { answerTask, type ScienceTask } from './simulation-tasks';

export default function runScienceTask(task: ScienceTask & { started: MessagePort }) {
	// The time limit counts from here: waiting in the queue and loading this module are not the run.
	task.started.postMessage('started');
	return answerTask(task);
}
