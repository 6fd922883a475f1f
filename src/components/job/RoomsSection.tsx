import { useState } from 'react';
import { api, ApiError, messageOf } from '../../lib/client/api-client';
import type { RoomRecord } from '../../lib/client/job-tree';
import ConfirmDialog from '../ui/ConfirmDialog';
import Notice from '../ui/Notice';
import RoomForm, { ROOM_TYPE_LABELS, type RoomValues } from './RoomForm';

interface Props {
	jobId: string;
	rooms: RoomRecord[];
	onChange: (rooms: RoomRecord[]) => void;
	onReload: () => void;
}

/** The job's rooms: type, floor and area; add, edit in place, delete. */
export default function RoomsSection({ jobId, rooms, onChange, onReload }: Props) {
	const [editing, setEditing] = useState<string | null>(null);
	const [deleting, setDeleting] = useState<RoomRecord | null>(null);
	const [busy, setBusy] = useState(false);
	const [message, setMessage] = useState<string | null>(null);

	const add = async (values: RoomValues) => {
		const { room } = await api<{ room: RoomRecord }>(`/api/jobs/${jobId}/rooms`, {
			method: 'POST',
			body: values,
		});
		onChange([...rooms, room]);
	};
	const save = (r: RoomRecord) => async (values: RoomValues) => {
		try {
			const { room } = await api<{ room: RoomRecord }>(`/api/rooms/${r.id}`, {
				method: 'PATCH',
				body: { ...values, version: r.version },
			});
			onChange(rooms.map((x) => (x.id === r.id ? room : x)));
			setEditing(null);
		} catch (err) {
			if (err instanceof ApiError && err.status === 409) {
				setMessage(
					'Someone else changed this room. The list now shows what it holds; make your change again.',
				);
				setEditing(null);
				onReload();
				return;
			}
			throw err;
		}
	};
	const remove = async () => {
		if (!deleting) return;
		setBusy(true);
		setMessage(null);
		try {
			await api(`/api/rooms/${deleting.id}`, { method: 'DELETE', body: { version: deleting.version } });
			onChange(rooms.filter((x) => x.id !== deleting.id));
			// Circuits and loads lose the room from their rooms served: load them again.
			onReload();
		} catch (err) {
			setMessage(messageOf(err));
		} finally {
			setBusy(false);
			setDeleting(null);
		}
	};

	return (
		<div className="space-y-4">
			{message && <Notice tone="error">{message}</Notice>}
			{rooms.length === 0 ? (
				<p className="text-ink-600">
					No rooms yet. Rooms decide GFCI and AFCI requirements (210.8, 210.12) and the floor area for general
					lighting.
				</p>
			) : (
				<div className="relative overflow-x-auto">
					<table className="w-full text-left text-sm" data-testid="rooms-table">
						<thead className="border-b border-ink-200 text-xs uppercase tracking-wide text-ink-500">
							<tr>
								<th className="py-2 pr-3">Room</th>
								<th className="py-2 pr-3">Type</th>
								<th className="py-2 pr-3 text-right">Floor</th>
								<th className="py-2 pr-3 text-right">Area</th>
								<th className="py-2">
									<span className="sr-only">Actions</span>
								</th>
							</tr>
						</thead>
						<tbody className="divide-y divide-ink-100">
							{rooms.map((r) =>
								editing === r.id ? (
									<tr key={r.id}>
										<td colSpan={5} className="py-3">
											<RoomForm
												idPrefix={`room-${r.id}`}
												initial={{
													name: r.name,
													type: r.type,
													floor: r.floor,
													areaFt2: r.areaFt2,
													inFloorArea: r.inFloorArea,
												}}
												submitLabel="Save the room"
												onSubmit={save(r)}
												onCancel={() => setEditing(null)}
											/>
										</td>
									</tr>
								) : (
									<tr key={r.id}>
										<td className="py-2 pr-3 font-semibold text-ink-900">{r.name || '—'}</td>
										<td className="py-2 pr-3">{ROOM_TYPE_LABELS[r.type]}</td>
										<td className="py-2 pr-3 text-right">{r.floor}</td>
										<td className="py-2 pr-3 text-right">{r.areaFt2} ft²</td>
										<td className="py-2 text-right">
											<span className="inline-flex gap-1">
												<button
													type="button"
													className="btn-quiet px-2 py-1"
													onClick={() => setEditing(r.id)}
													aria-label={`Edit ${r.name}`}
												>
													Edit
												</button>
												<button
													type="button"
													className="btn-quiet px-2 py-1 text-signal-violation"
													onClick={() => setDeleting(r)}
													aria-label={`Delete ${r.name}`}
												>
													Delete
												</button>
											</span>
										</td>
									</tr>
								),
							)}
						</tbody>
					</table>
				</div>
			)}
			<div className="rounded-md bg-ink-50 p-3">
				<h3 className="mb-2 text-sm font-semibold text-ink-800">Add a room</h3>
				<RoomForm idPrefix="new-room" submitLabel="Add the room" onSubmit={add} />
			</div>
			<ConfirmDialog
				open={!!deleting}
				title={`Delete ${deleting?.name ?? 'the room'}?`}
				body="Circuits and loads that serve it will no longer list it. This cannot be undone."
				confirmLabel="Delete the room"
				busy={busy}
				onConfirm={remove}
				onCancel={() => setDeleting(null)}
			/>
		</div>
	);
}
