import type { CircuitRecord } from '../../lib/client/job-tree';
import type { Finding } from '../../lib/electrical/types';
import SeverityBadge, { SEVERITY_ORDER } from '../ui/SeverityBadge';

interface Props {
	jobId: string;
	findings: Finding[];
	circuits: CircuitRecord[];
}

/** Where a finding's target is edited. */
export function findingHref(jobId: string, f: Finding, circuits: CircuitRecord[]): string | null {
	if (f.target.kind === 'circuit') {
		const c = circuits.find((x) => x.id === f.target.id);
		return c ? `/contractor/jobs/${jobId}/panels/${c.panelId}?circuit=${c.id}` : null;
	}
	if (f.target.kind === 'panel') return `/contractor/jobs/${jobId}/panels/${f.target.id}`;
	if (f.target.kind === 'room') return '#rooms';
	return null;
}

/** Every finding of the job, worst first, each linking to what it is about. */
export default function FindingsList({ jobId, findings, circuits }: Props) {
	const sorted = [...findings].sort(
		(a, b) => SEVERITY_ORDER.indexOf(a.severity) - SEVERITY_ORDER.indexOf(b.severity),
	);
	const shown = sorted.filter((f) => f.severity !== 'ok');
	const okCount = sorted.length - shown.length;
	if (shown.length === 0) {
		return (
			<p className="text-signal-ok">
				No warnings or violations. {okCount > 0 && `${okCount} checks passed.`}
			</p>
		);
	}
	return (
		<div>
			<ul className="divide-y divide-ink-100" data-testid="findings">
				{shown.map((f, i) => {
					const href = findingHref(jobId, f, circuits);
					return (
						<li
							key={`${f.code}-${f.target.id}-${i}`}
							className="flex items-start gap-3 py-2"
							data-finding={f.code}
						>
							<SeverityBadge severity={f.severity} />
							<div className="min-w-0 flex-1">
								{href ? (
									<a
										href={href}
										className="text-ink-900 underline decoration-ink-300 underline-offset-2 hover:decoration-copper-500"
									>
										{f.message}
									</a>
								) : (
									<span className="text-ink-900">{f.message}</span>
								)}
								<p className="text-xs text-copper-700">{f.rule}</p>
							</div>
						</li>
					);
				})}
			</ul>
			{okCount > 0 && <p className="mt-2 text-sm text-ink-500">{okCount} other checks passed.</p>}
		</div>
	);
}
