import { countOf } from '../lib/plural';
// `npm run digest`: sends the inventory digest now, through SMTP_HOST or the stand-in of a running `npm start`.
import { config } from '../lib/server/config';
import { getDb } from '../lib/server/db';
import { MailUnreachableError, sendInventoryDigest } from '../lib/server/inventory/digest';

getDb();

const daysArg = process.argv.find((a) => a.startsWith('--days='));
const days = daysArg ? Number(daysArg.slice('--days='.length)) : undefined;
if (days !== undefined && (!Number.isInteger(days) || days < 1)) {
	console.error('--days must be a whole number of days from 1 up.');
	process.exit(2);
}

try {
	const { recipients, digest } = await sendInventoryDigest({ days });
	if (recipients.length === 0) {
		console.log('No active inventory lead to send the digest to; nothing sent.');
	} else {
		console.log(
			`Digest for ${digest.today} sent to ${recipients.join(', ')} through ${config.smtp.host}:${config.smtp.port}: ${countOf(digest.expiring.total, 'lot')} expiring within ${countOf(digest.days, 'day')}, ${countOf(digest.low.length, 'component')} below reorder level.`
		);
	}
	process.exit(0);
} catch (cause) {
	if (cause instanceof MailUnreachableError) {
		console.error(cause.message);
		process.exit(1);
	}
	throw cause;
}
