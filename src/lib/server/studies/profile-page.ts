import { BIOMASS_COMPOSITIONS } from '$chemistry';
import { listComponents } from '../components/library';
import { z } from 'zod';
import { parseForm, revisionField, ruleFailure } from '../forms';
import { elementStatementTextsOf } from './profile-elements';
import { profileSchema, profileValues, saveProfile } from './profile-store';
import type { Actor } from '../audit';

/** Published tables the form can fill fractions from, each with its source. */
export function profileChoices() {
	return {
		presets: BIOMASS_COMPOSITIONS.map((b) => ({
			id: b.id,
			name: b.name,
			source: b.source,
			group: b.group
		})),
		carbonSources: listComponents()
			.filter((c) => ['sugar', 'polyol', 'amino-acid', 'other'].includes(c.category))
			.map((c) => ({ id: c.id, name: c.name }))
	};
}

/** Shared by the new and edit actions: returns the saved id, or the failure to send back. */
export function submitProfile(actor: Actor, formData: FormData, id: string | null) {
	const parsed = parseForm(profileSchema, formData);
	if (!parsed.ok) return { failure: parsed.failure };
	const revisionRead =
		id === null ? null : parseForm(z.object({ revision: revisionField }), formData);
	if (revisionRead && !revisionRead.ok) return { failure: revisionRead.failure };
	try {
		const revision = revisionRead ? revisionRead.data.revision : null;
		const values = profileValues(parsed.data, elementStatementTextsOf(formData));
		return { id: saveProfile(actor, id, revision, values) };
	} catch (cause) {
		return { failure: ruleFailure(formData, cause) };
	}
}
