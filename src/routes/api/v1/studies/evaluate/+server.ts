import { endpoint } from '$lib/server/api/endpoint';
import { evaluateRequest } from '$lib/server/api/operations/studies';
import { RuleError } from '$lib/server/rule-error';
import { evaluateStudy } from '$lib/server/studies/evaluate';
import { loadStudyInputs } from '$lib/server/studies/queries';

const WHAT_IF_FIELDS = new Set([
	'targetValue',
	'feedVolumeL',
	'kLaPerH',
	'o2MoleFraction',
	'temperatureC'
]);

export const POST = endpoint({ act: 'study.use', body: evaluateRequest }, async ({ body }) => {
	const { inputs } = loadStudyInputs(body.studyId);
	try {
		return await evaluateStudy(inputs, body.whatIf);
	} catch (cause) {
		// Point the caller at the what-if field it sent.
		if (cause instanceof RuleError && cause.field && WHAT_IF_FIELDS.has(cause.field)) {
			throw new RuleError(cause.message, { field: `whatIf.${cause.field}`, status: cause.status });
		}
		throw cause;
	}
});
