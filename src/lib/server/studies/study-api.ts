// The study writes of the JSON API, on the study form's own schema and store: the body is laid out as
// the form's fields (each feed of `feeds` in its slot), and every refusal comes back at its body path.
import { withEtag } from '../api/etag';
import { problemsOfIssues, refusalOf, withBodyPaths, type BodyPath } from '../api/refusals';
import type { Actor } from '../audit';
import { personName } from '../recipes/queries';
import { RuleError } from '../rule-error';
import { feedsOf, findStudy } from './queries';
import { FEED_SLOT_FIELDS, STUDY_FORM_DEFAULTS, studySchema, type StudyForm } from './study-form';
import { createStudy, studyFormValues, updateStudy } from './study-store';

type Loose = string | number | null | undefined;

/** A study as the API sends and takes it: the form's fields, and its feeds as a list. */
export interface StudyBody {
	[field: string]: Loose | Record<string, Loose>[];
	feeds?: Record<string, Loose>[];
}

const slotKey = (slot: number, key: string) =>
	`feed${slot}${key.charAt(0).toUpperCase()}${key.slice(1)}`;

/** A form field's path in the body: `feed2VolumeL` → `feeds.1.volumeL`; other fields as they are. */
export const studyBodyPath: BodyPath = (field) =>
	field.replace(
		/^feed(\d+)([A-Z]\w*)/,
		(_m, slot: string, key: string) =>
			`feeds.${Number(slot) - 1}.${key.charAt(0).toLowerCase()}${key.slice(1)}`
	);

const isSlotField = (key: string) => /^feed\d+[A-Z]/.test(key);

/** The form a person would have sent: null is an emptied field, a field left out keeps `base`'s. */
function formOfBody(body: StudyBody, base: Record<string, string>): Record<string, unknown> {
	const { feeds, ...fields } = body;
	const form: Record<string, unknown> = Object.fromEntries(
		Object.entries(base).filter(([key]) => !(feeds && isSlotField(key)))
	);
	feeds?.forEach((feed, i) => {
		for (const key of FEED_SLOT_FIELDS) {
			const value = feed[key.charAt(0).toLowerCase() + key.slice(1)];
			if (value !== undefined) form[slotKey(i + 1, key)] = value ?? '';
		}
	});
	for (const [key, value] of Object.entries(fields))
		if (value !== undefined) form[key] = value ?? '';
	return form;
}

/** The body through the study form's schema: every problem at once, at its body path. */
function readStudyForm(body: StudyBody, base: Record<string, string>): StudyForm {
	const read = studySchema.safeParse(formOfBody(body, base));
	if (!read.success) throw refusalOf(problemsOfIssues(read.error.issues, studyBodyPath));
	return read.data;
}

/** The new-study form's own defaults for what a person would leave as the form fills it in. */
const NEW_STUDY_BASE: Record<string, string> = Object.fromEntries(
	Object.entries(STUDY_FORM_DEFAULTS).filter(([key]) => !isSlotField(key))
);

/** A saved study with its feeds' plans, as GET answers it. */
export function studyRecord(id: string) {
	const row = findStudy(id);
	if (!row) throw new RuleError('No such study.', { status: 404 });
	const feeds = feedsOf(id).map(
		({ id: _id, studyId: _study, position: _position, ...plan }) => plan
	);
	return { ...row, createdByName: personName(row.createdById), feeds };
}

export function studyAnswer(id: string, created = false): Response {
	const record = studyRecord(id);
	const response = withEtag(record, record.revision, created ? 201 : 200);
	if (created) response.headers.set('location', `/api/v1/studies/${id}`);
	return response;
}

/** Creates a study as the new-study form does. */
export async function createStudyFromApi(
	actor: Actor & { id: string },
	body: StudyBody
): Promise<string> {
	const form = readStudyForm(body, NEW_STUDY_BASE);
	return withBodyPaths(() => createStudy(actor, form), studyBodyPath);
}

/** Saves a study as its edit form does, from the revision If-Match named. */
export async function updateStudyFromApi(
	actor: Actor,
	id: string,
	revision: number,
	body: StudyBody
): Promise<void> {
	const { revision: _stored, ...saved } = studyFormValues(id) ?? {};
	const form = readStudyForm(body, saved);
	await withBodyPaths(() => updateStudy(actor, id, revision, form), studyBodyPath);
}
