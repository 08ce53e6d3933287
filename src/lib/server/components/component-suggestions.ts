import { indexComponents, searchComponents, type ComponentIndex } from '$lib/component-search';
import { db, type Db } from '../db';
import type { Component } from '../db/schema';
import { listComponents } from './library';

type Reader = Pick<Db, 'select'>;

/** At most this many names in one refusal: enough to find a typo's target, short enough to read. */
const MAX_SUGGESTIONS = 3;

function listed(names: string[]): string {
	return names.length < 2 ? names.join('') : `${names.slice(0, -1).join(', ')} or ${names.at(-1)}`;
}

/**
 * Refusals for texts that name no component, each with the library's closest components (by the
 * picker's own search) when there are any: "no component “Sodium chlorde” in the library; did you
 * mean Sodium chloride (NaCl), …?". The library is read once, at the first refusal.
 */
export function noComponentRefusals(reader: Reader = db): (text: string) => string {
	let index: ComponentIndex<Component> | undefined;
	return (text) => {
		index ??= indexComponents(listComponents(reader));
		const refusal = `no component “${text}” in the library`;
		const names = searchComponents(index, text, MAX_SUGGESTIONS).map(({ component }) =>
			component.formula ? `${component.name} (${component.formula})` : component.name
		);
		return names.length ? `${refusal}; did you mean ${listed(names)}?` : `${refusal}.`;
	};
}
