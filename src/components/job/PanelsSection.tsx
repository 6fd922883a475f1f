import { useState } from 'react';
import { api, messageOf } from '../../lib/client/api-client';
import type { CircuitRecord, EngineAnswer, PanelRecord } from '../../lib/client/job-tree';
import { num } from '../../lib/electrical/format';
import ConfirmDialog from '../ui/ConfirmDialog';
import Notice from '../ui/Notice';
import SeverityBadge, { worstSeverity } from '../ui/SeverityBadge';
import PanelForm, { type PanelValues } from './PanelForm';
import { VOLTAGE_LABELS } from '../jobs/JobFields';

interface Props {
	jobId: string;
	panels: PanelRecord[];
	circuits: CircuitRecord[];
	engine: EngineAnswer;
	onAdded: (panel: PanelRecord) => void;
	onDeleted: (panelId: string) => void;
}

/** The job's panelboards: what each holds and carries, the panel editor, the CSV schedule, add and delete. */
export default function PanelsSection({ jobId, panels, circuits, engine, onAdded, onDeleted }: Props) {
	const [deleting, setDeleting] = useState<PanelRecord | null>(null);
	const [busy, setBusy] = useState(false);
	const [message, setMessage] = useState<string | null>(null);

	const add = async (values: PanelValues) => {
		const { panel } = await api<{ panel: PanelRecord }>(`/api/jobs/${jobId}/panels`, {
			method: 'POST',
			body: values,
		});
		onAdded(panel);
	};
	const remove = async () => {
		if (!deleting) return;
		setBusy(true);
		setMessage(null);
		try {
			await api(`/api/panels/${deleting.id}`, { method: 'DELETE', body: { version: deleting.version } });
			onDeleted(deleting.id);
		} catch (err) {
			setMessage(messageOf(err));
		} finally {
			setBusy(false);
			setDeleting(null);
		}
	};

	const feeders = circuits.filter((c) => c.poles >= 2 && !panels.some((p) => p.fedFromCircuitId === c.id));
	const hasMain = panels.some((p) => p.kind === 'main');

	return (
		<div className="space-y-4">
			{message && <Notice tone="error">{message}</Notice>}
			{panels.length === 0 && (
				<p className="text-ink-600">No panelboards yet. Start with the main panel supplied by the service.</p>
			)}
			<ul className="grid gap-3 md:grid-cols-2" data-testid="panels-list">
				{panels.map((p) => {
					const result = engine.ok ? engine.results.panels.find((r) => r.panelId === p.id) : undefined;
					const count = circuits.filter((c) => c.panelId === p.id).length;
					const sev = worstSeverity(
						engine.ok
							? engine.results.findings
									.filter(
										(f) =>
											(f.target.kind === 'panel' && f.target.id === p.id) ||
											(f.target.kind === 'circuit' &&
												circuits.some((c) => c.id === f.target.id && c.panelId === p.id)),
									)
									.map((f) => f.severity)
							: [],
					);
					const limit = p.mainBreakerA ?? p.busRatingA;
					return (
						<li key={p.id} className="rounded-md border border-ink-200 p-4">
							<div className="flex items-start justify-between gap-2">
								<div>
									<h3 className="font-bold text-ink-950">{p.name}</h3>
									<p className="text-sm text-ink-600">
										{p.kind === 'main' ? 'Main panel' : 'Subpanel'}
										{p.location && ` · ${p.location}`}
									</p>
								</div>
								<SeverityBadge severity={sev} />
							</div>
							<dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
								<dt className="text-ink-500">System</dt>
								<dd>{VOLTAGE_LABELS[p.voltageSystem]}</dd>
								<dt className="text-ink-500">Bus / main</dt>
								<dd>
									{p.busRatingA} A bus · {p.mainBreakerA ? `${p.mainBreakerA} A main` : 'main-lug'}
								</dd>
								<dt className="text-ink-500">Spaces</dt>
								<dd>
									{result ? `${result.used} used, ${result.free} free of ${p.spaces}` : `${p.spaces}`} ·{' '}
									{count} breaker{count === 1 ? '' : 's'}
								</dd>
								{result && (
									<>
										<dt className="text-ink-500">Calculated load</dt>
										<dd title={result.calculatedA.working}>
											{num(result.calculatedA.value, 1)} A of {limit} A · headroom{' '}
											{num(limit - result.calculatedA.value, 1)} A
										</dd>
									</>
								)}
							</dl>
							<div className="mt-3 flex flex-wrap gap-2">
								<a className="btn-primary" href={`/contractor/jobs/${jobId}/panels/${p.id}`}>
									Open the panel editor
								</a>
								<a className="btn-quiet" href={`/api/panels/${p.id}/circuits.csv`} download>
									Panel schedule (CSV)
								</a>
								<button
									type="button"
									className="btn-quiet text-signal-violation"
									onClick={() => setDeleting(p)}
								>
									Delete…
								</button>
							</div>
						</li>
					);
				})}
			</ul>
			<div className="rounded-md bg-ink-50 p-3">
				<h3 className="mb-2 text-sm font-semibold text-ink-800">Add a panelboard</h3>
				<PanelForm
					key={hasMain ? 'sub' : 'main'}
					feeders={feeders}
					defaults={{ kind: hasMain ? 'sub' : 'main', name: hasMain ? '' : 'Main panel' }}
					onSubmit={add}
				/>
			</div>
			<ConfirmDialog
				open={!!deleting}
				title={`Delete ${deleting?.name ?? 'the panel'}?`}
				body={`Its ${circuits.filter((c) => c.panelId === deleting?.id).length} breakers and every load on them are deleted with it. This cannot be undone.`}
				confirmLabel="Delete the panelboard"
				busy={busy}
				onConfirm={remove}
				onCancel={() => setDeleting(null)}
			/>
		</div>
	);
}
