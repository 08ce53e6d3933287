import type { Actor } from '../audit';
import { parseForm, ruleFailure } from '../forms';
import { saveVessel, vesselSchema } from './vessel-store';

/** Shared by the new and edit actions: returns the saved id, or the failure to send back. */
export function submitVessel(actor: Actor, formData: FormData, id: string | null) {
	const parsed = parseForm(vesselSchema, formData);
	if (!parsed.ok) return { failure: parsed.failure };
	try {
		const revision = id === null ? null : Number(formData.get('revision'));
		return { id: saveVessel(actor, id, revision, parsed.data) };
	} catch (cause) {
		return { failure: ruleFailure(formData, cause) };
	}
}
