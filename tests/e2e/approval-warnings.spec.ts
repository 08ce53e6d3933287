import { DEMO, DEMO_PASSWORD, expect, test } from './fixtures';
import { addComponent, createRecipe } from './recipe-helpers';

// The sign form shows what the analysis warns about and asks for an answer to each; the answers
// are part of the signature shown with the version.
test.describe('approving a version that carries a warning', () => {
	test.use({ role: 'media_scientist' });

	test('the engineer must acknowledge the solubility warning, and the answer is in the signature', async ({
		page,
		browser
	}) => {
		test.setTimeout(60_000);
		const name = `E2E warned ${Date.now()}`;
		await createRecipe(page, name);
		await addComponent(page, 1, 'Sodium chloride', '6', 'g/L');
		await addComponent(page, 2, 'L-Tyrosine', '2', 'g/L');
		const analysis = page.getByRole('complementary', { name: 'Live analysis' });
		await expect(analysis.getByText(/L-Tyrosine at 2 g\/L exceeds its solubility/)).toBeVisible();
		await page.getByRole('button', { name: 'Save draft' }).click();
		await expect(page.getByText(/Saved at/)).toBeVisible();
		await page.getByRole('link', { name: 'Back to version' }).click();
		await page.getByRole('button', { name: 'Submit for review' }).click();
		await expect(page.getByText('Version 1 is submitted for review.')).toBeVisible();
		// The reviewers were mailed (the mail stand-in accepted it), and the author sees who they are.
		await expect(page.getByText(/\d+ reviewers? told by mail\./)).toBeVisible();
		await expect(page.getByTestId('may-review')).toContainText('Demo Process Engineer');
		await expect(page.getByTestId('may-review')).not.toContainText('Demo Media Scientist,');
		const versionPath = new URL(page.url()).pathname;
		await page.goto('/');
		await expect(page.getByTestId('mine-in-review')).toContainText(`${name}, version 1`);

		const engineerContext = await browser.newContext();
		const engineer = await engineerContext.newPage();
		const session = await engineer.request.post('/api/v1/session', {
			data: { email: DEMO.engineer, password: DEMO_PASSWORD }
		});
		expect(session.status()).toBe(200);
		await engineer.goto('/');
		await engineer
			.getByTestId('waiting-for-me')
			.getByRole('link', { name: `${name}, version 1` })
			.click();
		await expect(engineer).toHaveURL(versionPath);
		const form = engineer.getByRole('form', { name: 'Electronic signature' });
		const warnings = form.getByTestId('sign-warnings');
		await expect(warnings).toContainText('One warning to acknowledge before signing');
		await expect(warnings).toContainText(
			/Solubility:.*L-Tyrosine at 2 g\/L exceeds its solubility/
		);
		const answer = form.getByLabel('Why it is acceptable (warning 1)');
		await form.getByLabel('Your password').fill(DEMO_PASSWORD);
		// The browser holds back an empty required answer; sent anyway, the server refuses it too.
		await answer.evaluate((el) => el.removeAttribute('required'));
		await form.getByRole('button', { name: 'Sign' }).click();
		await expect(form.getByText('Say why this is acceptable before signing.')).toBeVisible();
		await expect(answer).toHaveAttribute('aria-invalid', 'true');
		await expect(engineer.getByTestId('status').first()).toHaveText('In review');

		await answer.fill(
			'Tyrosine is dissolved at pH 11 in a side stock; the line is for the record.'
		);
		await form.getByLabel('Your password').fill(DEMO_PASSWORD);
		await form.getByRole('button', { name: 'Sign' }).click();
		await expect(
			engineer.getByText('Version 1 is approved. Your signature is recorded.')
		).toBeVisible();
		const signature = engineer.getByTestId('signature');
		await expect(signature).toContainText('Warnings acknowledged:');
		await expect(signature).toContainText('exceeds its solubility');
		await expect(signature).toContainText('Acknowledged: Tyrosine is dissolved at pH 11');
		await engineerContext.close();
	});
});
