import type { ReactNode } from 'react';

const TONES = {
	error: 'border-signal-violation/40 bg-red-50 text-signal-violation',
	ok: 'border-signal-ok/40 bg-green-50 text-signal-ok',
	info: 'border-signal-note/40 bg-blue-50 text-signal-note',
	caution: 'border-signal-warning/40 bg-amber-50 text-ink-900',
} as const;

/** A boxed message; errors are announced to screen readers. */
export default function Notice({ tone, children }: { tone: keyof typeof TONES; children: ReactNode }) {
	return (
		<div
			role={tone === 'error' ? 'alert' : 'status'}
			className={`rounded-md border p-3 text-sm ${TONES[tone]}`}
		>
			{children}
		</div>
	);
}
