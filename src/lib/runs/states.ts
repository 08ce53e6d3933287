// Run vocabulary shared by server and pages; no server code here.

/** A run is open while it takes data (its page refreshes), closed once ended. */
export const RUN_STATES = ['open', 'closed'] as const;
export type RunState = (typeof RUN_STATES)[number];
export const RUN_STATE_LABELS: Record<RunState, string> = { open: 'Running', closed: 'Ended' };

/** What a batch was used for in a run. */
export const RUN_BATCH_ROLES = ['medium', 'feed'] as const;
export type RunBatchRole = (typeof RUN_BATCH_ROLES)[number];
export const RUN_BATCH_ROLE_LABELS: Record<RunBatchRole, string> = {
	medium: 'Medium',
	feed: 'Feed'
};
