import { api } from '../../lib/client/api-client';
import type { JobRecord } from '../../lib/client/job-tree';
import { useResource } from '../../lib/client/use-resource';
import LoadState from '../ui/LoadState';
import StatusTag from './StatusTag';

/** The five jobs changed most recently. */
export default function RecentJobs() {
	const jobs = useResource(
		() => api<{ items: JobRecord[] }>('/api/jobs?sort=updated&pageSize=5').then((r) => r.items),
		'recent',
	);
	return (
		<LoadState
			loading={jobs.loading}
			error={jobs.error}
			onRetry={jobs.reload}
			what="your recent jobs"
			hasData={!!jobs.data}
		>
			{jobs.data && jobs.data.length === 0 && <p className="text-ink-600">No jobs yet.</p>}
			{jobs.data && jobs.data.length > 0 && (
				<ul className="divide-y divide-ink-100" data-testid="recent-jobs">
					{jobs.data.map((j) => (
						<li key={j.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
							<span>
								<a
									className="font-semibold text-copper-700 hover:underline"
									href={`/contractor/jobs/${j.id}`}
								>
									{j.name}
								</a>
								{j.address && <span className="text-sm text-ink-500"> · {j.address}</span>}
							</span>
							<StatusTag status={j.status} />
						</li>
					))}
				</ul>
			)}
		</LoadState>
	);
}
