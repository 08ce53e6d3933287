// Only the newest reset link can set a password, and a completed reset voids every other link.
import { describe, expect, it } from 'vitest';
import {
	completePasswordReset,
	inspectPasswordReset,
	requestPasswordReset
} from '$lib/server/people';
import { makeUser } from './helpers';
import { latestMailTo, linkIn, useMailStandIn } from './mail';

useMailStandIn();

async function resetLinkFor(email: string) {
	await requestPasswordReset(email, '127.0.0.1').mailSent;
	return linkIn(latestMailTo(email)!.textBody, 'reset');
}

describe('reset links', () => {
	it('a newer link voids the older one', async () => {
		const person = await makeUser();
		const older = await resetLinkFor(person.email);
		const newer = await resetLinkFor(person.email);
		expect(older).not.toBe(newer);
		expect(inspectPasswordReset(older).state).toBe('used');
		await expect(
			completePasswordReset(older, 'fresh-medium-batch-7', '127.0.0.1')
		).rejects.toThrow();
		await completePasswordReset(newer, 'fresh-medium-batch-7', '127.0.0.1');
		expect(inspectPasswordReset(newer).state).toBe('used');
	});
});
