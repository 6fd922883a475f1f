import type { Severity } from '../../lib/electrical/types';

const LOOK: Record<Severity, { label: string; className: string; mark: string }> = {
	ok: { label: 'OK', className: 'bg-green-50 text-signal-ok ring-signal-ok/40', mark: '✓' },
	note: { label: 'Note', className: 'bg-blue-50 text-signal-note ring-signal-note/40', mark: 'i' },
	warning: {
		label: 'Warning',
		className: 'bg-amber-50 text-signal-warning ring-signal-warning/50',
		mark: '!',
	},
	violation: {
		label: 'Violation',
		className: 'bg-red-50 text-signal-violation ring-signal-violation/50',
		mark: '×',
	},
};

export const SEVERITY_ORDER: Severity[] = ['violation', 'warning', 'note', 'ok'];

/** The worst of several severities ('ok' when none). */
export function worstSeverity(list: readonly Severity[]): Severity {
	for (const s of SEVERITY_ORDER) if (list.includes(s)) return s;
	return 'ok';
}

/** A finding's severity as a small labelled tag; `compact` shows only the mark (with the word for screen readers). */
export default function SeverityBadge({
	severity,
	compact = false,
}: {
	severity: Severity;
	compact?: boolean;
}) {
	const look = LOOK[severity];
	return (
		<span
			data-severity={severity}
			className={`inline-flex items-center gap-1 rounded px-1.5 py-0.5 text-xs font-semibold ring-1 ring-inset ${look.className}`}
		>
			<span aria-hidden="true" className="font-bold">
				{look.mark}
			</span>
			{compact ? <span className="sr-only">{look.label}</span> : look.label}
		</span>
	);
}
