// The site's time zone: every date and time a page shows is in it (src/lib/date-time.ts). A site
// setting holding an IANA name; UTC until an administrator sets it.
import { isTimeZone } from '$lib/date-time';
import type { Actor } from './audit';
import { db, type Db } from './db';
import { RuleError } from './rule-error';
import { settingText, storeSetting } from './site-settings';

type Reader = Pick<Db, 'select'>;

export const SITE_TIME_ZONE_KEY = 'site.time_zone';
export const DEFAULT_SITE_TIME_ZONE = 'UTC';
export const SITE_TIME_ZONE_LABEL = 'Site time zone';

function zoneOf(stored: string | undefined): string {
	return stored !== undefined && isTimeZone(stored) ? stored : DEFAULT_SITE_TIME_ZONE;
}

export function siteTimeZone(reader: Reader = db): string {
	return zoneOf(settingText(SITE_TIME_ZONE_KEY, reader));
}

export function setSiteTimeZone(actor: Actor, text: string): void {
	const name = text.trim();
	if (!isTimeZone(name))
		throw new RuleError(
			`${SITE_TIME_ZONE_LABEL}: “${name.slice(0, 60)}” is not a time zone name; use one such as Europe/Berlin, America/Chicago or UTC.`,
			{ field: 'siteTimeZone' }
		);
	storeSetting(
		actor,
		{ key: SITE_TIME_ZONE_KEY, value: name, action: 'settings.site_time_zone' },
		zoneOf
	);
}
