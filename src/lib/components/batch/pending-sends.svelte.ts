import { deserialize } from '$app/forms';

/**
 * What a technician entered that has not reached the server yet. Each entry is kept in localStorage
 * per batch and line, so a lost connection or a reload loses nothing; it is resent when the browser
 * is back online.
 */
export interface PendingSend {
	lineId: string;
	action: string;
	fields: Record<string, string>;
	savedAt: string;
}

export type SendOutcome =
	| { kind: 'ok'; message: string }
	| { kind: 'refused'; message: string; field?: string }
	| { kind: 'offline' }
	| { kind: 'offline-unsigned' };

function key(batchId: string): string {
	return `brothwright.batch.${batchId}.pending`;
}

function draftKey(batchId: string, lineId: string): string {
	return `brothwright.batch.${batchId}.line.${lineId}`;
}

export function readDraft(batchId: string, lineId: string): Record<string, string> {
	try {
		return JSON.parse(localStorage.getItem(draftKey(batchId, lineId)) ?? '{}');
	} catch {
		return {};
	}
}

export function writeDraft(batchId: string, lineId: string, fields: Record<string, string>): void {
	try {
		localStorage.setItem(draftKey(batchId, lineId), JSON.stringify(fields));
	} catch {
		// storage full or blocked: the form still holds the values
	}
}

export function clearDraft(batchId: string, lineId: string): void {
	try {
		localStorage.removeItem(draftKey(batchId, lineId));
	} catch {
		// nothing to clear
	}
}

export class PendingSends {
	items = $state<PendingSend[]>([]);
	readonly batchId: string;

	constructor(batchId: string) {
		this.batchId = batchId;
		try {
			this.items = JSON.parse(localStorage.getItem(key(batchId)) ?? '[]');
		} catch {
			this.items = [];
		}
	}

	private persist() {
		try {
			localStorage.setItem(key(this.batchId), JSON.stringify(this.items));
		} catch {
			// storage blocked: the entries stay in memory until reload
		}
	}

	private hold(send: PendingSend) {
		this.items = [
			...this.items.filter((i) => !(i.lineId === send.lineId && i.action === send.action)),
			send
		];
		this.persist();
	}

	private release(lineId: string, action: string) {
		this.items = this.items.filter((i) => !(i.lineId === lineId && i.action === action));
		this.persist();
	}

	/** Posts to a named action; a network failure keeps the entry to resend. */
	async send(action: string, lineId: string, fields: Record<string, string>): Promise<SendOutcome> {
		const body = new FormData();
		body.set('lineId', lineId);
		for (const [k, v] of Object.entries(fields)) body.set(k, v);
		let response: Response;
		try {
			response = await fetch(`?/${action}`, {
				method: 'POST',
				body,
				headers: { 'x-sveltekit-action': 'true' }
			});
		} catch {
			// A witness signs in person: a password is never kept on the tablet to resend later.
			if (fields.witnessPassword) return { kind: 'offline-unsigned' };
			this.hold({ lineId, action, fields, savedAt: new Date().toISOString() }); // eslint-disable-line svelte/prefer-svelte-reactivity -- a timestamp string, never observed
			return { kind: 'offline' };
		}
		const result = deserialize(await response.text());
		this.release(lineId, action);
		if (result.type === 'success')
			return {
				kind: 'ok',
				message: String((result.data as { saved?: string } | undefined)?.saved ?? 'Saved.')
			};
		if (result.type === 'failure') {
			const data = result.data as
				{ message?: string; fieldErrors?: Record<string, string[]> } | undefined;
			return {
				kind: 'refused',
				message: data?.message ?? 'Refused.',
				field: Object.keys(data?.fieldErrors ?? {})[0]
			};
		}
		if (result.type === 'error')
			return {
				kind: 'refused',
				message:
					(result.error as { message?: string } | undefined)?.message ??
					`The server answered ${response.status}.`
			};
		return { kind: 'refused', message: 'Unexpected answer; reload the page.' };
	}

	/** Resends everything held, oldest first; stops at the first that still cannot get through. */
	async resendAll(onOutcome: (item: PendingSend, outcome: SendOutcome) => void): Promise<void> {
		for (const item of [...this.items].sort((a, b) => a.savedAt.localeCompare(b.savedAt))) {
			const outcome = await this.send(item.action, item.lineId, item.fields);
			onOutcome(item, outcome);
			if (outcome.kind === 'offline') break;
		}
	}
}
