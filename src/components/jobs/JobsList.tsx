import { useEffect, useState } from 'react';
import { api } from '../../lib/client/api-client';
import type { JobRecord } from '../../lib/client/job-tree';
import { useResource } from '../../lib/client/use-resource';
import { JOB_SORTS, JOB_STATUSES, JOB_STATUS_LABELS } from '../../lib/schemas/job';
import LoadState from '../ui/LoadState';
import ImportExport from '../job/ImportExport';
import NewJobForm from './NewJobForm';
import StatusTag from './StatusTag';
import FormField from '../auth/FormField';

interface Props {
	firms: { id: string; name: string }[];
}

interface Page {
	items: JobRecord[];
	total: number;
	page: number;
	pageSize: number;
}

const SORT_LABELS: Record<(typeof JOB_SORTS)[number], string> = {
	updated: 'Recently changed',
	name: 'Name',
	created: 'Newest first',
	status: 'Status',
};
const PAGE_SIZE = 20;

/** The firm's jobs: search, status filter, sort and pages, with the new-job form. */
export default function JobsList({ firms }: Props) {
	const [q, setQ] = useState('');
	const [debouncedQ, setDebouncedQ] = useState('');
	const [status, setStatus] = useState('');
	const [sort, setSort] = useState<(typeof JOB_SORTS)[number]>('updated');
	const [page, setPage] = useState(1);
	const [creating, setCreating] = useState(false);

	useEffect(() => {
		const t = setTimeout(() => {
			setDebouncedQ(q.trim());
			setPage(1);
		}, 250);
		return () => clearTimeout(t);
	}, [q]);

	const params = new URLSearchParams({
		q: debouncedQ,
		sort,
		page: String(page),
		pageSize: String(PAGE_SIZE),
	});
	if (status) params.set('status', status);
	const query = params.toString();
	const jobs = useResource(() => api<Page>(`/api/jobs?${query}`), query);
	const pages = jobs.data ? Math.max(1, Math.ceil(jobs.data.total / jobs.data.pageSize)) : 1;

	return (
		<div className="space-y-6">
			<section className="panel-card">
				<div className="flex flex-wrap items-center justify-between gap-3">
					<h2 className="text-lg font-bold text-ink-950">New job</h2>
					<button
						type="button"
						className={creating ? 'btn-quiet' : 'btn-primary'}
						aria-expanded={creating}
						onClick={() => setCreating((c) => !c)}
					>
						{creating ? 'Close the form' : 'Start a new job'}
					</button>
				</div>
				{creating && (
					<div className="mt-4">
						<NewJobForm
							firms={firms}
							onCreated={(job) => window.location.assign(`/contractor/jobs/${job.id}?created=1`)}
						/>
					</div>
				)}
			</section>

			<section className="panel-card" aria-label="Import a job file">
				<ImportExport firms={firms} onImported={() => jobs.reload()} />
			</section>

			<section className="panel-card" aria-labelledby="jobs-heading">
				<h2 id="jobs-heading" className="text-lg font-bold text-ink-950">
					Jobs
				</h2>
				<div className="mt-3 grid gap-3 sm:grid-cols-[1fr_auto_auto]">
					<FormField id="jobs-q" label="Search">
						<input
							id="jobs-q"
							type="search"
							value={q}
							onChange={(e) => setQ(e.target.value)}
							placeholder="Name, address, homeowner or permit number"
							className="field-input"
						/>
					</FormField>
					<FormField id="jobs-status" label="Status">
						<select
							id="jobs-status"
							value={status}
							onChange={(e) => {
								setStatus(e.target.value);
								setPage(1);
							}}
							className="field-input"
						>
							<option value="">Any status</option>
							{JOB_STATUSES.map((s) => (
								<option key={s} value={s}>
									{JOB_STATUS_LABELS[s]}
								</option>
							))}
						</select>
					</FormField>
					<FormField id="jobs-sort" label="Sort">
						<select
							id="jobs-sort"
							value={sort}
							onChange={(e) => setSort(e.target.value as typeof sort)}
							className="field-input"
						>
							{JOB_SORTS.map((s) => (
								<option key={s} value={s}>
									{SORT_LABELS[s]}
								</option>
							))}
						</select>
					</FormField>
				</div>

				<div className="mt-4" aria-live="polite">
					<LoadState
						loading={jobs.loading}
						error={jobs.error}
						onRetry={jobs.reload}
						what="the jobs"
						hasData={!!jobs.data}
					>
						{jobs.data && jobs.data.items.length === 0 && (
							<p className="rounded-md bg-ink-50 p-4 text-ink-600">
								{debouncedQ || status
									? 'No job matches. Clear the search or the status filter.'
									: 'No jobs yet. Start one above, or import a job file.'}
							</p>
						)}
						{jobs.data && jobs.data.items.length > 0 && (
							<ul className="divide-y divide-ink-100" data-testid="jobs-list">
								{jobs.data.items.map((job) => (
									<li key={job.id} className="flex flex-wrap items-center justify-between gap-2 py-3">
										<div className="min-w-0">
											<a
												href={`/contractor/jobs/${job.id}`}
												className="font-semibold text-copper-700 underline-offset-2 hover:underline"
											>
												{job.name}
											</a>
											<p className="truncate text-sm text-ink-600">
												{[job.address, job.homeownerName, job.permitNumber && `Permit ${job.permitNumber}`]
													.filter(Boolean)
													.join(' · ') || '—'}
											</p>
										</div>
										<div className="flex items-center gap-3 text-sm text-ink-500">
											<StatusTag status={job.status} />
											<span>NEC {job.codeEdition}</span>
											<time dateTime={job.updatedAt}>{new Date(job.updatedAt).toLocaleDateString()}</time>
										</div>
									</li>
								))}
							</ul>
						)}
						{jobs.error && jobs.data && (
							<p role="alert" className="field-error">
								{jobs.error}{' '}
								<button type="button" className="underline" onClick={jobs.reload}>
									Retry
								</button>
							</p>
						)}
					</LoadState>
				</div>

				{jobs.data && jobs.data.total > 0 && (
					<nav aria-label="Pages of jobs" className="mt-4 flex items-center justify-between gap-2 text-sm">
						<span className="text-ink-600">
							{jobs.data.total} job{jobs.data.total === 1 ? '' : 's'} · page {page} of {pages}
						</span>
						<span className="flex gap-2">
							<button
								type="button"
								className="btn-quiet"
								disabled={page <= 1}
								onClick={() => setPage((p) => p - 1)}
							>
								Previous
							</button>
							<button
								type="button"
								className="btn-quiet"
								disabled={page >= pages}
								onClick={() => setPage((p) => p + 1)}
							>
								Next
							</button>
						</span>
					</nav>
				)}
			</section>
		</div>
	);
}
