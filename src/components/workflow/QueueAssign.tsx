import { useState } from 'react';
import { api, messageOf } from '../../lib/client/api-client';

/** "Assign to me" in the queue: takes the job and opens its review screen. */
export default function QueueAssign({ jobId, label }: { jobId: string; label: string }) {
	const [busy, setBusy] = useState(false);
	const [error, setError] = useState<string | null>(null);
	return (
		<span>
			<button
				type="button"
				className="btn-quiet px-2 py-1 text-xs"
				disabled={busy}
				data-testid="assign"
				onClick={async () => {
					setBusy(true);
					setError(null);
					try {
						await api(`/api/jobs/${jobId}/assign`, { method: 'POST' });
						window.location.href = `/inspector/jobs/${jobId}`;
					} catch (err) {
						setError(messageOf(err));
						setBusy(false);
					}
				}}
			>
				{label}
			</button>
			{error && (
				<span role="alert" className="block text-xs text-signal-violation">
					{error}
				</span>
			)}
		</span>
	);
}
