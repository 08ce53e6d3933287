import { recordAudit } from '../audit';
import { createUser, findUserByEmail } from '../people';
import { seedDemoRuns } from './runs';
import { seedReferenceLibrary } from '../components/reference-library';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './accounts';
import { seedDemoInventory } from './inventory';
import { seedDemoRecipes } from './recipes';
import { seedDemoStudies } from './studies';

/**
 * Adds whatever part of the demo is missing and nothing else, so running it again changes nothing.
 * Returns how many records it added.
 */
export async function seedDemo(): Promise<number> {
	let added = 0;
	for (const account of DEMO_ACCOUNTS) {
		if (findUserByEmail(account.email)) continue;
		const id = await createUser({ ...account, password: DEMO_PASSWORD });
		recordAudit(
			{ id: null, email: null },
			{
				action: 'demo.account_created',
				subjectType: 'user',
				subjectId: id,
				detail: { email: account.email, roles: account.roles }
			}
		);
		added++;
	}
	// The recipes need the library; loading it here too keeps the demo whole when seeded on its own.
	added += seedReferenceLibrary();
	added += await seedDemoRecipes();
	added += await seedDemoInventory();
	added += await seedDemoStudies();
	added += seedDemoRuns();
	return added;
}
