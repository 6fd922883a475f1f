import type { ReactNode } from 'react';

interface Props {
	loading: boolean;
	error: string | null;
	onRetry: () => void;
	/** What is being loaded, e.g. "the panels". */
	what: string;
	/** Shown once data is there. */
	children?: ReactNode;
	hasData: boolean;
}

/** Loading line, or the error with a Retry button, or the content. */
export default function LoadState({ loading, error, onRetry, what, children, hasData }: Props) {
	if (error && !hasData) {
		return (
			<div
				role="alert"
				className="rounded-md border border-signal-violation/40 bg-red-50 p-3 text-sm text-signal-violation"
			>
				<p>
					We could not load {what}: {error}
				</p>
				<button type="button" className="btn-quiet mt-2" onClick={onRetry}>
					Retry
				</button>
			</div>
		);
	}
	if (loading && !hasData) {
		return (
			<p className="flex items-center gap-2 text-sm text-ink-500" role="status">
				<span
					className="inline-block h-3 w-3 animate-spin rounded-full border-2 border-ink-300 border-t-copper-500"
					aria-hidden="true"
				/>
				Loading {what}…
			</p>
		);
	}
	return <>{children}</>;
}
