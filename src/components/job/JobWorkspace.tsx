import { useMemo } from 'react';
import { api } from '../../lib/client/api-client';
import { engineMessageInWords } from '../../lib/client/engine-messages';
import { computeTree, type JobTree } from '../../lib/client/job-tree';
import { useResource } from '../../lib/client/use-resource';
import SketchesSection from '../sketches/SketchesSection';
import InspectionsSection from '../workflow/InspectionsSection';
import { PERMIT_ISSUED } from '../../lib/workflow/status';
import PermitSection from '../workflow/PermitSection';
import ReviewComments from '../workflow/ReviewComments';
import JobHistory from '../workflow/Timeline';
import LoadState from '../ui/LoadState';
import Notice from '../ui/Notice';
import SeverityBadge from '../ui/SeverityBadge';
import FindingsList from './FindingsList';
import ImportExport from './ImportExport';
import JobDetails from './JobDetails';
import LoadCalculation from './LoadCalculation';
import PanelsSection from './PanelsSection';
import RoomsSection from './RoomsSection';

interface Props {
	jobId: string;
	firms: { id: string; name: string }[];
	created?: boolean;
}

function Section({
	id,
	title,
	children,
	aside,
}: {
	id: string;
	title: string;
	children: React.ReactNode;
	aside?: React.ReactNode;
}) {
	return (
		<section id={id} aria-labelledby={`${id}-h`} className="panel-card scroll-mt-4">
			<div className="mb-3 flex flex-wrap items-center justify-between gap-2">
				<h2 id={`${id}-h`} className="text-lg font-bold text-ink-950">
					{title}
				</h2>
				{aside}
			</div>
			{children}
		</section>
	);
}

const NAV = [
	['permit', 'Permit'],
	['details', 'Details'],
	['rooms', 'Rooms'],
	['panels', 'Panelboards'],
	['findings', 'Findings'],
	['load-calculation', 'Load calculation'],
	['sketches', 'Sketches'],
	['lighting', 'Lighting layout'],
	['import-export', 'Import & export'],
	['history', 'History'],
] as const;

/** The job page: details, rooms, panelboards, findings, the load calculation, sketches, import and export. */
export default function JobWorkspace({ jobId, firms, created }: Props) {
	const tree = useResource(() => api<JobTree>(`/api/jobs/${jobId}/tree`), jobId);
	const t = tree.data;
	// The browser runs the same engine on the records it holds, so every write shows at once.
	const engine = useMemo(() => (t ? computeTree(t) : null), [t]);
	const update = (patch: Partial<JobTree>) => tree.setData((prev) => ({ ...(prev as JobTree), ...patch }));

	return (
		<LoadState loading={tree.loading} error={tree.error} onRetry={tree.reload} what="the job" hasData={!!t}>
			{t && engine && (
				<div className="space-y-6">
					<div>
						<p className="text-sm text-ink-500">
							<a href="/contractor/jobs" className="underline">
								Jobs
							</a>{' '}
							/
						</p>
						<h1 className="text-2xl font-bold tracking-tight text-ink-950" data-testid="job-name">
							{t.job.name}
						</h1>
						{t.job.address && <p className="text-ink-600">{t.job.address}</p>}
					</div>
					{created && <Notice tone="ok">The job is created. Add its rooms and its main panel next.</Notice>}
					{tree.error && (
						<Notice tone="error">
							{tree.error}{' '}
							<button type="button" className="underline" onClick={tree.reload}>
								Retry
							</button>
						</Notice>
					)}
					<nav aria-label="Sections of the job" className="flex flex-wrap gap-1 text-sm">
						{NAV.map(([id, label]) => (
							<a
								key={id}
								href={id === 'lighting' ? `/contractor/jobs/${jobId}/lighting` : `#${id}`}
								className="rounded-md border border-ink-200 bg-white px-3 py-1 font-semibold text-ink-700 hover:border-copper-400"
							>
								{label}
							</a>
						))}
					</nav>

					<Section id="permit" title="Permit">
						<PermitSection jobId={jobId} tree={t} onMoved={tree.reload} />
					</Section>

					{t.job.currentRevision > 0 && (
						<Section id="review-comments" title="Plan review comments">
							<ReviewComments key={`${t.job.status}|${t.job.currentRevision}`} jobId={jobId} />
						</Section>
					)}

					<Section id="details" title="Job details">
						<JobDetails job={t.job} onSaved={(job) => update({ job })} onReload={tree.reload} />
					</Section>

					<Section id="rooms" title={`Rooms (${t.rooms.length})`}>
						<RoomsSection
							jobId={jobId}
							rooms={t.rooms}
							onChange={(rooms) => update({ rooms })}
							onReload={tree.reload}
						/>
					</Section>

					<Section id="panels" title={`Panelboards (${t.panels.length})`}>
						<PanelsSection
							jobId={jobId}
							panels={t.panels}
							circuits={t.circuits}
							engine={engine}
							onAdded={(panel) => update({ panels: [...t.panels, panel] })}
							onDeleted={(panelId) => {
								const gone = new Set(t.circuits.filter((c) => c.panelId === panelId).map((c) => c.id));
								update({
									panels: t.panels.filter((p) => p.id !== panelId),
									circuits: t.circuits.filter((c) => !gone.has(c.id)),
									loads: t.loads.filter((l) => !gone.has(l.circuitId)),
								});
							}}
						/>
					</Section>

					<Section
						id="findings"
						title="Findings"
						aside={
							engine.ok && (
								<span className="flex gap-1" aria-label="Findings by severity">
									{(['violation', 'warning', 'note'] as const).map((s) => (
										<span key={s} className="inline-flex items-center gap-1 text-sm text-ink-600">
											<SeverityBadge severity={s} compact /> {engine.results.summary[s]}
										</span>
									))}
								</span>
							)
						}
					>
						{engine.ok ? (
							<FindingsList jobId={jobId} findings={engine.results.findings} circuits={t.circuits} />
						) : (
							<IncompleteJob errors={engine.errors} />
						)}
					</Section>

					<Section id="load-calculation" title="Load calculation (Article 220)">
						{engine.ok ? (
							<LoadCalculation service={engine.results.service} />
						) : (
							<IncompleteJob errors={engine.errors} />
						)}
					</Section>

					{PERMIT_ISSUED.includes(t.job.status) && (
						<Section id="inspections" title="Inspections">
							<InspectionsSection key={t.job.status} jobId={jobId} mode="contractor" />
						</Section>
					)}

					<Section id="sketches" title="Sketches">
						<SketchesSection jobId={jobId} rooms={t.rooms} />
					</Section>

					<Section id="import-export" title="Import and export">
						<ImportExport jobId={jobId} firms={firms} />
					</Section>

					<Section id="history" title="History">
						<JobHistory
							jobId={jobId}
							refreshKey={`${t.job.status}|${t.job.currentRevision}|${t.job.updatedAt}`}
						/>
					</Section>
				</div>
			)}
		</LoadState>
	);
}

function IncompleteJob({ errors }: { errors: string[] }) {
	return (
		<Notice tone="info">
			<p className="font-semibold">The checks run once the job is complete enough:</p>
			<ul className="mt-1 list-disc pl-5">
				{errors.map((e) => (
					<li key={e}>{engineMessageInWords(e)}</li>
				))}
			</ul>
		</Notice>
	);
}
