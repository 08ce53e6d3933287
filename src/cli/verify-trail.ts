// `npm run verify-trail`: checks the audit trail's and the signatures' hash chains and the database
// guards; exits 1 and names the first broken link when anything fails.
import { config } from '../lib/server/config';
import { getDb } from '../lib/server/db';
import { describeTrailCheck, verifyTrail } from '../lib/server/trail/verify';

const check = verifyTrail(getDb().$client, config.migrationsFolder);
for (const line of describeTrailCheck(check)) (check.ok ? console.log : console.error)(line);
process.exit(check.ok ? 0 : 1);
