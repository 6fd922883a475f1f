import { api } from '../../lib/client/api-client';
import { useResource } from '../../lib/client/use-resource';
import type { CommentView } from '../../lib/repositories/review-comments';
import LoadState from '../ui/LoadState';
import CommentThread from './CommentThread';

/**
 * The reviewer's comments on the contractor's job page, grouped by the revision they were written
 * on (latest first): the contractor answers each and marks it addressed before resubmitting.
 */
export default function ReviewComments({
	jobId,
	side = 'contractor',
}: {
	jobId: string;
	/** 'reader' for those who may read the comments but not answer them (an administrator). */
	side?: 'contractor' | 'reader';
}) {
	const comments = useResource(
		() => api<{ items: CommentView[]; threadsOpen: boolean }>(`/api/jobs/${jobId}/comments`),
		jobId,
	);
	const items = comments.data?.items ?? [];
	const revisions = [...new Set(items.map((c) => c.revision))].sort((a, b) => b - a);
	const open = items.filter((c) => c.status === 'open').length;
	const changed = (c: CommentView) =>
		comments.setData((prev) => ({
			threadsOpen: prev?.threadsOpen ?? false,
			items: (prev?.items ?? []).map((x) => (x.id === c.id ? c : x)),
		}));

	return (
		<LoadState
			loading={comments.loading}
			error={comments.error}
			onRetry={comments.reload}
			what="the review comments"
			hasData={!!comments.data}
		>
			{items.length === 0 ? (
				<p className="text-ink-600" data-testid="no-review-comments">
					The reviewer has written no comments on this job.
				</p>
			) : (
				<div className="space-y-4" data-testid="review-comments">
					<p className="text-sm text-ink-700">
						{open === 0
							? 'No comment is open.'
							: side === 'contractor'
								? `${open} comment${open === 1 ? '' : 's'} still open: answer each and mark it addressed, then resubmit.`
								: `${open} comment${open === 1 ? '' : 's'} still open.`}
					</p>
					{revisions.map((n) => (
						<section key={n} aria-label={`Comments on revision ${n}`}>
							<h3 className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">
								Revision {n}
							</h3>
							<div className="space-y-2">
								{items
									.filter((c) => c.revision === n)
									.map((c) => (
										<CommentThread
											key={c.id}
											comment={c}
											side={comments.data?.threadsOpen ? side : 'reader'}
											onChanged={changed}
										/>
									))}
							</div>
						</section>
					))}
				</div>
			)}
		</LoadState>
	);
}
