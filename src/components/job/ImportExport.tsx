import { useRef, useState } from 'react';
import { api, ApiError, messageOf } from '../../lib/client/api-client';
import type { JobRecord } from '../../lib/client/job-tree';
import Notice from '../ui/Notice';

interface Props {
	/** The job to export, when on a job page. */
	jobId?: string;
	firms: { id: string; name: string }[];
	/** Told about a job just imported (the jobs list shows it at once). */
	onImported?: (job: JobRecord) => void;
}

/** Export a job as a JSON job document; import one as a new job (with every validation message and its path). */
export default function ImportExport({ jobId, firms, onImported }: Props) {
	const fileRef = useRef<HTMLInputElement>(null);
	const [firmId, setFirmId] = useState(firms[0]?.id ?? '');
	const [busy, setBusy] = useState(false);
	const [problems, setProblems] = useState<{ message: string; list: string[] } | null>(null);
	const [imported, setImported] = useState<{ job: JobRecord; counts: Record<string, number> } | null>(null);

	const doImport = async (e: React.FormEvent) => {
		e.preventDefault();
		setProblems(null);
		setImported(null);
		const file = fileRef.current?.files?.[0];
		if (!file) {
			setProblems({ message: 'Choose a job file (.json) first.', list: [] });
			return;
		}
		let doc: unknown;
		try {
			doc = JSON.parse(await file.text());
		} catch {
			setProblems({
				message: `“${file.name}” is not a JSON file. Export a job from Ampledger and choose that file.`,
				list: [],
			});
			return;
		}
		setBusy(true);
		try {
			const res = await api<{ job: JobRecord; counts: Record<string, number> }>(
				`/api/jobs/import?firmId=${encodeURIComponent(firmId)}`,
				{
					method: 'POST',
					body: doc,
				},
			);
			setImported(res);
			onImported?.(res.job);
		} catch (err) {
			const list =
				err instanceof ApiError
					? Object.entries(err.fields).flatMap(([path, msgs]) =>
							msgs.map((m) => (path === '_' ? m : `${path}: ${m}`)),
						)
					: [];
			setProblems({ message: messageOf(err), list });
		} finally {
			setBusy(false);
		}
	};

	return (
		<div className="grid gap-4 md:grid-cols-2">
			{jobId && (
				<div>
					<h3 className="font-semibold text-ink-900">Export</h3>
					<p className="mt-1 text-sm text-ink-600">
						The whole job (settings, rooms, panels, circuits and loads) as a JSON job document.
					</p>
					<a className="btn-quiet mt-2" href={`/api/jobs/${jobId}/export`} download>
						Download the job file
					</a>
				</div>
			)}
			<form onSubmit={doImport} aria-label="Import a job">
				<h3 className="font-semibold text-ink-900">Import</h3>
				<p className="mt-1 text-sm text-ink-600">
					Creates a new job from a job file. Nothing is written unless the whole file is valid.
				</p>
				<div className="mt-2 space-y-2">
					<label htmlFor="import-file" className="field-label">
						Job file (.json)
					</label>
					<input
						id="import-file"
						ref={fileRef}
						type="file"
						accept="application/json,.json"
						className="block w-full text-sm"
					/>
					{firms.length > 1 && (
						<>
							<label htmlFor="import-firm" className="field-label">
								Firm
							</label>
							<select
								id="import-firm"
								value={firmId}
								onChange={(e) => setFirmId(e.target.value)}
								className="field-input"
							>
								{firms.map((f) => (
									<option key={f.id} value={f.id}>
										{f.name}
									</option>
								))}
							</select>
						</>
					)}
					<button type="submit" className="btn-quiet" disabled={busy}>
						{busy ? 'Importing…' : 'Import as a new job'}
					</button>
				</div>
			</form>
			{problems && (
				<div className="md:col-span-2">
					<Notice tone="error">
						<p className="font-semibold">{problems.message}</p>
						{problems.list.length > 0 && (
							<ul className="mt-2 list-disc space-y-0.5 pl-5 font-mono text-xs" data-testid="import-problems">
								{problems.list.map((p) => (
									<li key={p}>{p}</li>
								))}
							</ul>
						)}
					</Notice>
				</div>
			)}
			{imported && (
				<div className="md:col-span-2">
					<Notice tone="ok">
						Imported “{imported.job.name}”: {imported.counts.rooms ?? 0} rooms, {imported.counts.panels ?? 0}{' '}
						panels, {imported.counts.circuits ?? 0} circuits, {imported.counts.loads ?? 0} loads.{' '}
						<a className="font-semibold underline" href={`/contractor/jobs/${imported.job.id}`}>
							Open the imported job
						</a>
					</Notice>
				</div>
			)}
		</div>
	);
}
