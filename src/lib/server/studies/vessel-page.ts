import type { Actor } from '../audit';
import { z } from 'zod';
import { parseForm, revisionField, ruleFailure } from '../forms';
import { saveVessel, vesselSchema } from './vessel-store';

/** Shared by the new and edit actions: returns the saved id, or the failure to send back. */
export function submitVessel(actor: Actor, formData: FormData, id: string | null) {
	const parsed = parseForm(vesselSchema, formData);
	if (!parsed.ok) return { failure: parsed.failure };
	const revisionRead =
		id === null ? null : parseForm(z.object({ revision: revisionField }), formData);
	if (revisionRead && !revisionRead.ok) return { failure: revisionRead.failure };
	try {
		const revision = revisionRead ? revisionRead.data.revision : null;
		return { id: saveVessel(actor, id, revision, parsed.data) };
	} catch (cause) {
		return { failure: ruleFailure(formData, cause) };
	}
}
