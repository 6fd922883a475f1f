import { useEffect, useRef, useState } from 'react';
import { api, ApiError } from '../../lib/client/api-client';
import ConfirmDialog from '../ui/ConfirmDialog';
import Notice from '../ui/Notice';
import PacketLayouts from './PacketLayouts';

interface PanelItem {
	id: string;
	name: string;
	location: string;
}
interface MapLinkState {
	link: string | null;
	createdAt?: string;
	createdByName?: string | null;
	unreadable?: boolean;
}

type PacketState =
	| { phase: 'idle' }
	| { phase: 'preparing' }
	| { phase: 'ready'; url: string; sizeKb: number; seconds: number }
	| { phase: 'error'; message: string };

async function errorOf(res: Response): Promise<string> {
	const body = (await res.json().catch(() => null)) as {
		error?: { message?: string; current?: { errors?: string[] } };
	} | null;
	const more = body?.error?.current?.errors?.slice(0, 3).join(' ');
	return [body?.error?.message ?? `The server answered with an error (${res.status}).`, more]
		.filter(Boolean)
		.join(' ');
}

/** The job's documents: panel schedules and directory cards, the permit packet with a preview, and the panel map link. */
export default function JobDocuments({ jobId }: { jobId: string }) {
	const [panels, setPanels] = useState<PanelItem[] | null>(null);
	const [loadError, setLoadError] = useState<string | null>(null);
	const [packet, setPacket] = useState<PacketState>({ phase: 'idle' });
	const [map, setMap] = useState<MapLinkState | null>(null);
	const [mapBusy, setMapBusy] = useState(false);
	const [mapError, setMapError] = useState<string | null>(null);
	const [confirm, setConfirm] = useState<'revoke' | 'reissue' | null>(null);
	const [copied, setCopied] = useState(false);
	const objectUrl = useRef<string | null>(null);
	const base = `/api/jobs/${jobId}/documents`;

	useEffect(() => {
		api<{ items: PanelItem[] }>(`/api/jobs/${jobId}/panels`)
			.then((r) => setPanels(r.items))
			.catch((e: unknown) => setLoadError(e instanceof ApiError ? e.message : 'Could not load the panels.'));
		api<MapLinkState>(`/api/jobs/${jobId}/map-token`)
			.then(setMap)
			.catch((e: unknown) =>
				setMapError(e instanceof ApiError ? e.message : 'Could not load the panel map link.'),
			);
		return () => {
			if (objectUrl.current) URL.revokeObjectURL(objectUrl.current);
		};
	}, [jobId]);

	async function preparePacket() {
		setPacket({ phase: 'preparing' });
		const started = performance.now();
		try {
			const res = await fetch(`${base}/packet.pdf`, { credentials: 'same-origin' });
			if (!res.ok) {
				setPacket({ phase: 'error', message: await errorOf(res) });
				return;
			}
			const blob = await res.blob();
			if (objectUrl.current) URL.revokeObjectURL(objectUrl.current);
			objectUrl.current = URL.createObjectURL(blob);
			setPacket({
				phase: 'ready',
				url: objectUrl.current,
				sizeKb: Math.round(blob.size / 1024),
				seconds: (performance.now() - started) / 1000,
			});
		} catch {
			setPacket({
				phase: 'error',
				message: 'We could not reach the server. Check your connection and try again.',
			});
		}
	}

	async function changeLink(action: 'revoke' | 'reissue') {
		setMapBusy(true);
		setMapError(null);
		try {
			if (action === 'revoke') {
				await api(`/api/jobs/${jobId}/map-token`, { method: 'DELETE' });
				setMap({ link: null });
			} else {
				setMap(await api<MapLinkState>(`/api/jobs/${jobId}/map-token`, { method: 'POST' }));
			}
		} catch (e) {
			setMapError(e instanceof ApiError ? e.message : 'The link could not be changed.');
		} finally {
			setMapBusy(false);
			setConfirm(null);
		}
	}

	return (
		<section
			className="panel-card mt-6 space-y-5"
			aria-labelledby="documents-heading"
			data-testid="job-documents"
		>
			<div>
				<h2 id="documents-heading" className="text-xl font-bold text-ink-950">
					Documents
				</h2>
				<p className="text-sm text-ink-600">
					Made from the job as it is now; every change shows in the next one.
				</p>
			</div>

			<div>
				<h3 className="font-semibold text-ink-900">Panel schedules and directory cards</h3>
				{loadError && <Notice tone="error">{loadError}</Notice>}
				{panels === null && !loadError && <p className="text-sm text-ink-500">Loading the panels…</p>}
				{panels?.length === 0 && (
					<p className="text-sm text-ink-600">Add a panel to make its schedule and card.</p>
				)}
				<ul className="mt-2 divide-y divide-ink-100">
					{panels?.map((p) => (
						<li key={p.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 py-2 text-sm">
							<span className="min-w-32 font-semibold text-ink-900">{p.name}</span>
							<a
								className="text-copper-700 underline"
								href={`${base}/panel-schedule/${p.id}.pdf?size=letter`}
								target="_blank"
								rel="noopener"
							>
								Schedule (Letter)
							</a>
							<a
								className="text-copper-700 underline"
								href={`${base}/panel-schedule/${p.id}.pdf?size=a4`}
								target="_blank"
								rel="noopener"
							>
								Schedule (A4)
							</a>
							<a
								className="text-copper-700 underline"
								href={`${base}/directory-card/${p.id}.pdf`}
								target="_blank"
								rel="noopener"
							>
								Directory card
							</a>
						</li>
					))}
				</ul>
			</div>

			<div>
				<h3 className="font-semibold text-ink-900">Permit packet</h3>
				<p className="text-sm text-ink-600">
					Cover, sheet index, load calculation, schedules, findings, sketches, cautions and a signature block.
				</p>
				<button
					type="button"
					className="btn-primary mt-2"
					onClick={preparePacket}
					disabled={packet.phase === 'preparing'}
				>
					{packet.phase === 'ready' ? 'Prepare it again' : 'Prepare the packet'}
				</button>
				{packet.phase === 'preparing' && (
					<p
						className="mt-2 flex items-center gap-2 text-sm text-ink-700"
						role="status"
						data-testid="packet-progress"
					>
						<span
							className="h-4 w-4 animate-spin rounded-full border-2 border-copper-200 border-t-copper-600"
							aria-hidden="true"
						/>
						Preparing the packet…
					</p>
				)}
				{packet.phase === 'error' && (
					<div className="mt-2">
						<Notice tone="error">{packet.message}</Notice>
					</div>
				)}
				{packet.phase === 'ready' && (
					<div className="mt-3 space-y-2" data-testid="packet-ready">
						<p className="text-sm text-ink-700">
							Ready: {packet.sizeKb.toLocaleString('en-US')} KB in {packet.seconds.toFixed(1)} s.{' '}
							<a
								className="font-semibold text-copper-700 underline"
								href={packet.url}
								download={`permit-packet-${jobId.slice(0, 8)}.pdf`}
							>
								Download the packet
							</a>
						</p>
						<iframe
							title="Permit packet preview"
							src={packet.url}
							className="h-[36rem] w-full rounded border border-ink-200"
						/>
					</div>
				)}
			</div>

			<PacketLayouts jobId={jobId} />

			<div>
				<h3 className="font-semibold text-ink-900">Homeowner’s panel map link</h3>
				<p className="text-sm text-ink-600">
					The directory card’s QR code opens it. Revoke it when the home changes hands; print new cards after
					issuing a new link.
				</p>
				{mapError && <Notice tone="error">{mapError}</Notice>}
				{map && (
					<div className="mt-2 space-y-2 text-sm">
						{map.link ? (
							<p className="break-all" data-testid="map-link">
								<a className="text-copper-700 underline" href={map.link} target="_blank" rel="noopener">
									{map.link}
								</a>
								<button
									type="button"
									className="btn-quiet ml-2 px-2 py-1"
									onClick={() => navigator.clipboard?.writeText(map.link!).then(() => setCopied(true))}
								>
									{copied ? 'Copied' : 'Copy'}
								</button>
							</p>
						) : (
							<p className="text-ink-600">
								{map.unreadable
									? 'The live link cannot be shown any more: issue a new one.'
									: 'No live link. A directory card made now issues one.'}
							</p>
						)}
						<div className="flex flex-wrap gap-2">
							<button
								type="button"
								className="btn-quiet"
								disabled={mapBusy}
								onClick={() => setConfirm('reissue')}
							>
								Issue a new link
							</button>
							<button
								type="button"
								className="btn-quiet"
								disabled={mapBusy || !map.link}
								onClick={() => setConfirm('revoke')}
							>
								Revoke the link
							</button>
						</div>
					</div>
				)}
			</div>
			<ConfirmDialog
				open={confirm !== null}
				title={confirm === 'revoke' ? 'Revoke the panel map link?' : 'Issue a new panel map link?'}
				body={
					confirm === 'revoke'
						? 'Cards already printed will stop opening the map. The homeowner can still see it when signed in.'
						: 'The current link stops working; cards already printed will need replacing.'
				}
				confirmLabel={confirm === 'revoke' ? 'Revoke' : 'Issue a new link'}
				busy={mapBusy}
				onConfirm={() => void changeLink(confirm!)}
				onCancel={() => setConfirm(null)}
			/>
		</section>
	);
}
