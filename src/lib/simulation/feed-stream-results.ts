// A run's feed streams as the charts, the CSV and the results summary name them.
import type { FeedStreamResult } from '$chemistry';

export type FeedStreamsOfRun = { feedStreams?: FeedStreamResult[] | null };

/** The stream's label, or its place in the request counted from 1. */
export function feedStreamName(stream: Pick<FeedStreamResult, 'label'>, index: number): string {
	return stream.label ?? `Feed ${index + 1}`;
}

export type SeparateFeedStream = FeedStreamResult & { feedLPerH: number[] };

/** The streams to draw and export one by one; a lone stream's rate is the total, so it has none. */
export function separateFeedStreams(result: FeedStreamsOfRun): SeparateFeedStream[] {
	const streams = result.feedStreams ?? [];
	return streams.every((stream): stream is SeparateFeedStream => stream.feedLPerH !== null)
		? streams.length > 1
			? streams
			: []
		: [];
}

export interface FeedDelivery {
	run: string;
	stream: string;
	strategy: FeedStreamResult['strategy'];
	deliveredL: number;
}

/** Every fed stream of every run with what it delivered, in request order. */
export function listFeedDeliveries(
	runs: { label: string; result: FeedStreamsOfRun }[]
): FeedDelivery[] {
	return runs.flatMap(({ label, result }) =>
		(result.feedStreams ?? []).map((stream, i) => ({
			run: label,
			stream: feedStreamName(stream, i),
			strategy: stream.strategy,
			deliveredL: stream.deliveredL
		}))
	);
}
