import type { ApiOperation } from '../openapi';
import { SIGNATURE_REQUIRED_TYPE } from '../signature-required';

/** The Problem403 example: what every act that needs an electronic signature answers. */
export const signatureRequiredExample = {
	summary: 'An act that needs an electronic signature, which only the app takes',
	value: {
		type: SIGNATURE_REQUIRED_TYPE,
		title: 'Forbidden',
		status: 403,
		detail:
			'Approving needs your signature with your password in the app: open https://brothwright.example.org/recipes/3f2c…/versions/2',
		signAt: 'https://brothwright.example.org/recipes/3f2c…/versions/2'
	}
};

const never = (what: string, page: string) =>
	`${what} is an electronic signature: the signer gives it with their password in the app, never through the API. For anyone who may do it this answers 403 with type ${SIGNATURE_REQUIRED_TYPE} and signAt, the address of ${page} where it is signed (404 for an unknown id)`;

/** Acts that need a signature: documented so a script finds where to send its person. */
export const signatureOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/recipes/{id}/versions/{n}/review',
		summary: never('Reviewing a recipe version', 'the version’s page'),
		act: 'recipe.sign',
		successStatus: 403
	},
	{
		method: 'post',
		path: '/api/v1/recipes/{id}/versions/{n}/approve',
		summary: never('Approving a recipe version', 'the version’s page'),
		act: 'recipe.sign',
		successStatus: 403
	},
	{
		method: 'post',
		path: '/api/v1/lots/{id}/release',
		summary: never('Releasing a lot', 'the lot’s page'),
		act: 'lot.keep',
		successStatus: 403
	},
	{
		method: 'post',
		path: '/api/v1/lots/{id}/reject',
		summary: never('Rejecting a lot', 'the lot’s page'),
		act: 'lot.keep',
		successStatus: 403
	},
	{
		method: 'post',
		path: '/api/v1/batches/{id}/review',
		summary: never('Reviewing a batch (release or rejection)', 'the batch’s page'),
		act: 'batch.review',
		successStatus: 403
	}
];
