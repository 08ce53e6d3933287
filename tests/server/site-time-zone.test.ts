// The site's time zone: UTC until set, a real zone name or a refusal that names the field, and every
// change in the audit trail with its old and new value.
import { describe, expect, it } from 'vitest';
import { allAuditEvents } from '$lib/server/audit';
import { RuleError } from '$lib/server/rule-error';
import { setSiteTimeZone, siteTimeZone } from '$lib/server/site-time-zone';

const admin = { id: null, email: 'admin@lab.test' };

describe('the site time zone', () => {
	it('is UTC until set, then the zone set, audited', () => {
		expect(siteTimeZone()).toBe('UTC');
		setSiteTimeZone(admin, ' Europe/Berlin ');
		expect(siteTimeZone()).toBe('Europe/Berlin');
		const [entry] = allAuditEvents({ action: 'settings.site_time_zone' });
		expect(entry.detail).toEqual({ from: 'UTC', to: 'Europe/Berlin' });
	});

	it('refuses a name that is not a zone, naming the field and keeping the one set', () => {
		let refusal: unknown;
		try {
			setSiteTimeZone(admin, 'Mars/Olympus_Mons');
		} catch (cause) {
			refusal = cause;
		}
		expect(refusal).toBeInstanceOf(RuleError);
		expect(refusal).toMatchObject({ field: 'siteTimeZone' });
		expect((refusal as Error).message).toMatch(
			/^Site time zone: “Mars\/Olympus_Mons” is not a time zone name/
		);
		expect(siteTimeZone()).toBe('Europe/Berlin');
	});
});
