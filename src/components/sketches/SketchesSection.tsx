import { useRef, useState } from 'react';
import { api, messageOf } from '../../lib/client/api-client';
import type { RoomRecord } from '../../lib/client/job-tree';
import { useResource } from '../../lib/client/use-resource';
import ConfirmDialog from '../ui/ConfirmDialog';
import LoadState from '../ui/LoadState';
import Notice from '../ui/Notice';
import FormField from '../auth/FormField';

interface Sketch {
	id: string;
	roomId: string | null;
	caption: string;
	originalName: string;
	contentType: string;
	size: number;
	pageCount: number | null;
	version: number;
	urls: { file: string; thumbnail: string | null };
}

interface Props {
	jobId: string;
	rooms: RoomRecord[];
}

function sizeText(bytes: number): string {
	return bytes >= 1024 * 1024
		? `${(bytes / 1024 / 1024).toFixed(1)} MB`
		: `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

/** Floor-plan sketches and photos: upload with a caption and a room, thumbnails, delete. */
export default function SketchesSection({ jobId, rooms }: Props) {
	const sketches = useResource(
		() => api<{ sketches: Sketch[] }>(`/api/jobs/${jobId}/sketches`).then((r) => r.sketches),
		jobId,
	);
	const fileRef = useRef<HTMLInputElement>(null);
	const [caption, setCaption] = useState('');
	const [roomId, setRoomId] = useState('');
	const [uploading, setUploading] = useState(false);
	const [rejected, setRejected] = useState<string | null>(null);
	const [done, setDone] = useState<string | null>(null);
	const [deleting, setDeleting] = useState<Sketch | null>(null);
	const [busy, setBusy] = useState(false);

	const upload = async (e: React.FormEvent) => {
		e.preventDefault();
		setRejected(null);
		setDone(null);
		const files = fileRef.current?.files;
		if (!files || files.length === 0) {
			setRejected('Choose at least one PNG, JPEG or PDF file to upload.');
			return;
		}
		const body = new FormData();
		for (const f of Array.from(files)) body.append('files', f);
		body.append('caption', caption);
		body.append('roomId', roomId);
		setUploading(true);
		try {
			const res = await api<{ sketches: Sketch[] }>(`/api/jobs/${jobId}/sketches`, { method: 'POST', body });
			sketches.setData((prev) => [...(prev ?? []), ...res.sketches]);
			setDone(`${res.sketches.length} sketch${res.sketches.length === 1 ? '' : 'es'} added.`);
			setCaption('');
			if (fileRef.current) fileRef.current.value = '';
		} catch (err) {
			setRejected(messageOf(err));
		} finally {
			setUploading(false);
		}
	};

	const remove = async () => {
		if (!deleting) return;
		setBusy(true);
		try {
			await api(`/api/sketches/${deleting.id}`, { method: 'DELETE' });
			sketches.setData((prev) => (prev ?? []).filter((s) => s.id !== deleting.id));
		} catch (err) {
			setRejected(messageOf(err));
		} finally {
			setBusy(false);
			setDeleting(null);
		}
	};

	const roomName = (id: string | null) => rooms.find((r) => r.id === id)?.name;

	return (
		<div className="space-y-4">
			<form
				onSubmit={upload}
				className="grid gap-3 rounded-md bg-ink-50 p-3 sm:grid-cols-[1.4fr_1.4fr_1fr_auto]"
				aria-label="Upload sketches"
			>
				<FormField id="sketch-files" label="Files (PNG, JPEG or PDF)">
					<input
						id="sketch-files"
						ref={fileRef}
						type="file"
						name="files"
						multiple
						accept="image/png,image/jpeg,application/pdf"
						className="block w-full text-sm file:mr-3 file:rounded-md file:border-0 file:bg-ink-800 file:px-3 file:py-2 file:text-sm file:font-semibold file:text-white"
					/>
				</FormField>
				<FormField id="sketch-caption" label="Caption">
					<input
						id="sketch-caption"
						value={caption}
						onChange={(e) => setCaption(e.target.value)}
						maxLength={200}
						className="field-input"
						placeholder="First floor, kitchen wall elevations"
					/>
				</FormField>
				<FormField id="sketch-room" label="Room (optional)">
					<select
						id="sketch-room"
						value={roomId}
						onChange={(e) => setRoomId(e.target.value)}
						className="field-input"
					>
						<option value="">Whole house / none</option>
						{rooms.map((r) => (
							<option key={r.id} value={r.id}>
								{r.name}
							</option>
						))}
					</select>
				</FormField>
				<div className="sm:pt-6">
					<button type="submit" className="btn-primary" disabled={uploading}>
						{uploading ? 'Uploading…' : 'Upload'}
					</button>
				</div>
			</form>
			{rejected && <Notice tone="error">{rejected}</Notice>}
			{done && <Notice tone="ok">{done}</Notice>}
			<LoadState
				loading={sketches.loading}
				error={sketches.error}
				onRetry={sketches.reload}
				what="the sketches"
				hasData={!!sketches.data}
			>
				{sketches.data && sketches.data.length === 0 && (
					<p className="text-ink-600">No sketches yet. Upload a floor plan or a photo of the hand sketch.</p>
				)}
				{sketches.data && sketches.data.length > 0 && (
					<ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" data-testid="sketches">
						{sketches.data.map((s) => (
							<li
								key={s.id}
								className="flex flex-col overflow-hidden rounded-md border border-ink-200 bg-white"
							>
								<a href={s.urls.file} target="_blank" rel="noopener" className="block aspect-[4/3] bg-ink-50">
									{s.urls.thumbnail ? (
										<img
											src={s.urls.thumbnail}
											alt={s.caption || s.originalName}
											className="h-full w-full object-contain"
											loading="lazy"
										/>
									) : (
										<span className="flex h-full items-center justify-center text-sm font-semibold text-ink-600">
											PDF · {s.pageCount ?? '?'} page{s.pageCount === 1 ? '' : 's'}
										</span>
									)}
								</a>
								<div className="flex flex-1 flex-col gap-1 p-2 text-sm">
									<p className="font-semibold text-ink-900">{s.caption || s.originalName}</p>
									<p className="text-xs text-ink-500">
										{roomName(s.roomId) ? `${roomName(s.roomId)} · ` : ''}
										{sizeText(s.size)}
									</p>
									<button
										type="button"
										className="mt-auto self-start text-xs font-semibold text-signal-violation underline"
										onClick={() => setDeleting(s)}
									>
										Delete…
									</button>
								</div>
							</li>
						))}
					</ul>
				)}
			</LoadState>
			<ConfirmDialog
				open={!!deleting}
				title="Delete this sketch?"
				body={`“${deleting?.caption || deleting?.originalName || ''}” is removed from the job and from its permit packet. This cannot be undone.`}
				confirmLabel="Delete the sketch"
				busy={busy}
				onConfirm={remove}
				onCancel={() => setDeleting(null)}
			/>
		</div>
	);
}
