import Notice from '../ui/Notice';

interface Props {
	what: string;
	current: Record<string, unknown> | null;
	/** Field names and labels to show from the current record, and how to word a value when not as stored. */
	fields: [key: string, label: string, format?: (value: unknown) => string][];
	onReload: () => void;
}

function shown(v: unknown): string {
	if (v === null || v === undefined || v === '') return '—';
	if (Array.isArray(v)) return v.length ? v.join(', ') : '—';
	if (typeof v === 'object') return Object.values(v as object).join(' ');
	return String(v);
}

/** A stale write (409): what the record holds now, and a way to load it and re-apply. */
export default function ConflictNotice({ what, current, fields, onReload }: Props) {
	return (
		<Notice tone="caution">
			<p className="font-semibold">Someone else changed this {what}</p>
			<p className="mt-1">
				Nothing was saved. Here is what it holds now; load it, then make your change again.
			</p>
			{current && (
				<dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5" data-testid="conflict-current">
					{fields.map(([k, label, format]) => (
						<div key={k} className="contents">
							<dt className="text-ink-600">{label}</dt>
							<dd className="font-semibold">{format ? format(current[k]) : shown(current[k])}</dd>
						</div>
					))}
				</dl>
			)}
			<button type="button" className="btn-quiet mt-3" onClick={onReload}>
				Load the current values
			</button>
		</Notice>
	);
}
