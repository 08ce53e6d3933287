import { countOf } from '$lib/plural';
/**
 * One plain sentence per audit action, for people who read the trail without knowing its codes.
 * Each builder gets the entry's detail and its subject as the trail shows it (batch number, lot
 * code, recipe name and version ...); an action missing here reads as its code in words.
 */

export type Detail = Record<string, unknown>;
type Sentence = (detail: Detail, subject: string) => string;

function text(value: unknown): string {
	if (value === null || value === undefined) return '';
	if (Array.isArray(value)) return value.map(text).join(', ');
	if (typeof value === 'object') return JSON.stringify(value);
	return String(value);
}

/** ": reason" when there is one, else nothing. */
function because(detail: Detail, key = 'reason'): string {
	const reason = text(detail[key]).trim();
	return reason ? `: ${reason}` : '';
}

/** A stored count with its noun; the count as stored when it is not a number. */
function plural(n: unknown, one: string, many = `${one}s`): string {
	return typeof n === 'number' ? countOf(n, one, many) : `${text(n)} ${many}`;
}

const STATUS_WORDS: Record<string, string> = {
	released: 'Released',
	rejected: 'Rejected',
	quarantine: 'Put in quarantine'
};

const SENTENCES: Record<string, Sentence> = {
	'batch.planned': (d, s) =>
		`Planned batch ${s}${typeof d.volumeMl === 'number' ? ` of ${d.volumeMl / 1000} L` : ''}`,
	'batch.started': (_, s) => `Started preparing batch ${s}`,
	'batch.lot_chosen': (d) => `Chose lot ${text(d.lot)} for line ${text(d.line)}`,
	'batch.lot_refused': (d) =>
		`Refused lot ${text(d.lot) || `“${text(d.scanned)}”`} at line ${text(d.line)}${because(d)}`,
	'batch.line_done': (d) =>
		`Signed line ${text(d.line)} as done: ${text(d.actual)}${d.verdict ? ` (${text(d.verdict)})` : ''}${because(d)}`,
	'batch.measured': (d) =>
		`Recorded pH ${text(d.ph) || '—'} and osmolality ${text(d.osmolality) || '—'} mOsm/kg${
			Number(d.deviations) > 0 ? `, with ${plural(d.deviations, 'deviation')}` : ''
		}`,
	'batch.prepared': (_, s) => `Signed batch ${s} as prepared`,
	'batch.line_corrected': (d, s) =>
		`Corrected line ${text(d.line)} of batch ${s}${because(d)}${d.witnessedBy ? `, witnessed by ${text(d.witnessedBy)}` : ''}`,
	'batch.correction_refused': (d, s) => `Refused a correction on batch ${s}${because(d)}`,
	'batch.released': (_, s) => `Released batch ${s} for use`,
	'batch.rejected': (d, s) => `Rejected batch ${s}${because(d)}`,
	'component.created': (d, s) => `Added component ${text(d.name) || s}`,
	'component.updated': (d, s) => `Changed component ${s || text(d.name)}`,
	'component.imported': (d) => `Imported ${plural(d.count, 'component')}: ${text(d.names)}`,
	'component.stock_settings_set': (_, s) => `Set the stock settings of ${s}`,
	'demo.account_created': (d) => `Created the demo account ${text(d.email)}`,
	'inventory.digest_sent': (d) =>
		`Sent the stock digest to ${text(d.recipients)} (${text(d.expiring)} expiring, ${text(d.low)} low)`,
	'lot.received': (d, s) => `Received lot ${s || text(d.code)} from ${text(d.supplier)}`,
	'lot.adjusted': (d, s) =>
		`${Number(d.quantity) < 0 ? 'Took stock from' : 'Added stock to'} lot ${s}${because(d)}`,
	'lot.disposed': (d, s) => `Disposed of stock from lot ${s}${because(d)}`,
	'lot.certificate_added': (d, s) => `Added the certificate ${text(d.files)} to lot ${s}`,
	'lot.made': (d, s) =>
		`Made stock ${s || text(d.code)} as batch ${text(d.batch)}, expiring ${text(d.expiresOn)}`,
	'lot.recalled': (d, s) =>
		`Recalled lot ${s || text(d.code)} (${d.lotAction === 'retest' ? 'retest before use' : 'on hold'}), flagging ${plural(d.flagged, 'batch', 'batches')}${because(d)}`,
	'lot.held': (d, s) => `Put lot ${s || text(d.code)} on hold${because(d)}`,
	'lot.retested': (d, s) =>
		`Signed a retest of lot ${s || text(d.code)}: ${text(d.result)}${d.retestOn ? `; next retest ${text(d.retestOn)}` : ''}`,
	'lot.recall_refused': (d, s) => `Refused a recall of lot ${s || text(d.code)}${because(d)}`,
	'lot.recall_mail_failed': (d, s) =>
		`Could not mail the recall of lot ${s}${because(d, 'problem')}`,
	'organism_profile.created': (d, s) => `Created organism profile ${text(d.name) || s}`,
	'organism_profile.updated': (_, s) => `Changed organism profile ${s}`,
	'outbox.read': (d) => `Read the message “${text(d.subject)}” in the outbox`,
	'outbox.listed': () => 'Opened the outbox',
	'password.reset_requested': () => 'Asked for a password reset link',
	'password.reset_completed': () => 'Set a new password through a reset link',
	'password.changed': (d) =>
		`Changed their own password, signing out ${plural(d.sessionsEnded, 'other session')}`,
	'password.change_refused': (d) => `Was refused a password change${because(d)}`,
	'password.reset_throttled': () => 'Asked for a password reset link too often; no mail was sent',
	'person.invited': (d) => `Invited ${text(d.email)} as ${text(d.roles)}`,
	'person.invitation_accepted': () => 'Accepted the invitation and made the account',
	'person.roles_changed': (_, s) => `Changed the roles of ${s}`,
	'person.deactivated': (_, s) => `Deactivated the account of ${s}`,
	'person.reactivated': (_, s) => `Reactivated the account of ${s}`,
	'recipe.created': (d, s) => `Created recipe ${text(d.name) || s}`,
	'recipe.draft_started': (d, s) => `Started draft ${s} from version ${text(d.basedOn)}`,
	'recipe.draft_saved': (d, s) =>
		d.from === 'csv' ? `Replaced the lines of ${s} from a CSV file` : `Saved draft ${s}`,
	'recipe.lines_imported': (d, s) => `Imported ${plural(d.lines, 'line')} into ${s}`,
	'recipe.submitted': (_, s) => `Submitted ${s} for review`,
	'recipe.reviewed': (_, s) => `Signed ${s} as reviewed`,
	'recipe.approved': (_, s) => `Approved ${s}`,
	'recipe.returned_to_draft': (d, s) => `Returned ${s} to draft${because(d, 'comment')}`,
	'recipe.retired': (d, s) => `Retired ${s}${because(d)}`,
	'settings.batch_number_pattern': () => 'Changed the batch number pattern',
	'settings.hard_band_percent': (d) =>
		`Changed the hard band for weighings from ±${text(d.from)} % to ±${text(d.to)} %`,
	'settings.site_time_zone': (d) =>
		`Changed the site time zone from ${text(d.from)} to ${text(d.to)}`,
	'settings.session_absolute_days': (d) =>
		`Changed the longest session from ${text(d.from)} to ${text(d.to)} days`,
	'settings.simulation_time_limit_s': (d) =>
		`Changed the time limit per simulation run from ${text(d.from)} s to ${text(d.to)} s`,
	'sign_in.succeeded': () => 'Signed in',
	'sign_in.failed': (d) => `Sign-in failed${because(d)}`,
	'sign_in.refused': (d) => `Sign-in refused${because(d)}`,
	sign_out: () => 'Signed out',
	'signature.recorded': (d, s) => `Signed ${s} as “${text(d.meaning)}”`,
	'signature.refused': (d, s) => `Refused a signature (“${text(d.meaning)}”) on ${s}${because(d)}`,
	'simulation.scenario_saved': (d) => `Saved the simulation scenario “${text(d.name)}”`,
	'simulation.scenario_updated': (d) => `Renamed the simulation scenario “${text(d.from)}”`,
	'simulation.scenario_deleted': (d) => `Deleted the simulation scenario “${text(d.name)}”`,
	'study.created': (d, s) => `Created study ${text(d.name) || s}`,
	'study.updated': (_, s) => `Changed study ${s}`,
	'study.deleted': (d, s) => `Deleted study ${text(d.name) || s}`,
	'vessel.created': (d, s) => `Added vessel ${text(d.name) || s}`,
	'vessel.updated': (_, s) => `Changed vessel ${s}`,
	'vessel.kla_point_added': (d, s) =>
		`Added a kLa of ${text(d.kLaPerH)} 1/h at ${text(d.agitationRpm)} rpm and ${text(d.gasFlowLPerMin)} L/min to the map of vessel ${s}`,
	'vessel.kla_point_removed': (d, s) =>
		`Removed the kLa of ${text(d.kLaPerH)} 1/h measured ${text(d.measuredOn)} from the map of vessel ${s}${because(d)}`,
	'run.created': (d, s) => `Started run ${s || text(d.number)}`,
	'run.updated': (_, s) => `Changed run ${s}`,
	'run.closed': (_, s) => `Ended run ${s}`,
	'run.reopened': (d, s) => `Reopened run ${s}${because(d)}`,
	'run.batch_linked': (d, s) => `Linked batch ${text(d.batchNumber)} (${text(d.role)}) to run ${s}`,
	'run.batch_unlinked': (d, s) =>
		`Unlinked batch ${text(d.batchNumber)} from run ${s}${because(d)}`,
	'run.data_added': (d, s) =>
		`Added ${plural(d.inserted, 'point')} to run ${s} from ${d.source === 'api' ? 'the API' : `the file ${text(d.fileName)}`}${typeof d.replaced === 'number' && d.replaced > 0 ? `, replacing ${plural(d.replaced, 'point')}` : ''}`,
	'token.created': (d) =>
		`Made the ${text(d.kind)} API token “${text(d.name)}” with ${plural(Array.isArray(d.scopes) ? d.scopes.length : d.scopes, 'scope')} (${text(d.scopes)}), expiring ${text(d.expiresAt).slice(0, 10)}`,
	'token.revoked': (d) => `Revoked the API token “${text(d.name)}”${because(d)}`,
	'token.scope_first_used': (d) =>
		`The API token “${text(d.name)}” used its scope ${text(d.scope)} for the first time`,
	'profile.learned_from_run': (d, s) =>
		`Saved growth values fitted to run ${text(d.runNumber)} to profile ${s} (${text(d.fields)})`
};

for (const [status, word] of Object.entries(STATUS_WORDS)) {
	SENTENCES[`lot.${status}`] = (d, s) => `${word} lot ${s || text(d.code)}${because(d)}`;
}

/** "lot.certificate_added" → "Lot: certificate added": what an unknown code says, in words. */
export function readableCode(action: string): string {
	const [head, ...rest] = action.split('.');
	const words = (part: string) => part.replace(/_/g, ' ').trim();
	const first = words(head);
	const capital = first.charAt(0).toUpperCase() + first.slice(1);
	return rest.length ? `${capital}: ${rest.map(words).join(' ')}` : capital;
}

/** The sentence for one entry; `subject` is the subject's number or name as the trail shows it. */
export function describeAction(action: string, detail: Detail | null, subject: string): string {
	const build = SENTENCES[action];
	if (!build) return readableCode(action);
	const via = detail?.viaToken as { name?: unknown } | undefined;
	const sentence = build(detail ?? {}, subject)
		.replace(/\s+/g, ' ')
		.trim();
	return via ? `${sentence} (through the API token “${text(via.name)}”)` : sentence;
}

/** Every action that has its own sentence, for the act filter. */
export function describedActions(): string[] {
	return Object.keys(SENTENCES).sort();
}
