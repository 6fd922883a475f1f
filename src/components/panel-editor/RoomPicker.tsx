import type { RoomRecord } from '../../lib/client/job-tree';

interface Props {
	id: string;
	legend: string;
	rooms: RoomRecord[];
	value: string[];
	onChange: (ids: string[]) => void;
	compact?: boolean;
}

/** Rooms served, as a group of checkboxes (keyboard: Tab between rooms, Space to tick). */
export default function RoomPicker({ id, legend, rooms, value, onChange, compact = false }: Props) {
	if (rooms.length === 0) return <p className="text-xs text-ink-500">No rooms recorded for this job.</p>;
	const toggle = (roomId: string, on: boolean) =>
		onChange(on ? [...value, roomId] : value.filter((v) => v !== roomId));
	const boxes = (
		<div className={`flex flex-wrap gap-x-3 gap-y-1 ${compact ? 'max-w-[16rem]' : ''}`}>
			{rooms.map((r) => (
				<label key={r.id} className="inline-flex items-center gap-1.5 text-sm text-ink-800">
					<input
						type="checkbox"
						className="h-4 w-4 accent-copper-600"
						checked={value.includes(r.id)}
						onChange={(e) => toggle(r.id, e.target.checked)}
					/>
					{r.name}
				</label>
			))}
		</div>
	);
	if (compact) {
		const names = rooms.filter((r) => value.includes(r.id)).map((r) => r.name);
		return (
			<details className="text-sm">
				<summary
					className="cursor-pointer text-ink-700"
					aria-label={`${legend}: ${names.join(', ') || 'none'}`}
				>
					{names.length ? names.join(', ') : 'None'}
				</summary>
				<fieldset id={id} className="mt-1 rounded border border-ink-200 bg-white p-2">
					<legend className="sr-only">{legend}</legend>
					{boxes}
				</fieldset>
			</details>
		);
	}
	return (
		<fieldset id={id}>
			<legend className="field-label">{legend}</legend>
			{boxes}
		</fieldset>
	);
}
