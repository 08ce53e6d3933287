import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { organismProfile, user } from '$lib/server/db/schema';
import { submitProfile } from '$lib/server/studies/profile-page';

type FailureData = {
	message: string;
	fieldErrors: Record<string, string[]>;
	values: Record<string, string>;
};

/**
 * Submits the organism profile form as the demo engineer, with `base` under each test's own fields
 * (a fresh name each time). Call after the demo is seeded.
 */
export function createProfileForm(namePrefix: string, base: Record<string, string>) {
	const actor = () => {
		const engineer = db.select().from(user).where(eq(user.email, 'engineer@demo.test')).get()!;
		return { id: engineer.id, email: engineer.email };
	};
	const form = (fields: Record<string, string>) => {
		const data = new FormData();
		const named = { name: `${namePrefix} ${crypto.randomUUID().slice(0, 8)}`, ...base, ...fields };
		for (const [k, v] of Object.entries(named)) data.set(k, v);
		return data;
	};
	return {
		saved(fields: Record<string, string>) {
			const result = submitProfile(actor(), form(fields), null);
			if (!('id' in result)) throw new Error(`not saved: ${JSON.stringify(result.failure.data)}`);
			return db.select().from(organismProfile).where(eq(organismProfile.id, result.id!)).get()!;
		},
		failure(fields: Record<string, string>) {
			const result = submitProfile(actor(), form(fields), null);
			if (!result.failure) throw new Error('saved, but should have been refused');
			return result.failure.data as FailureData;
		}
	};
}
