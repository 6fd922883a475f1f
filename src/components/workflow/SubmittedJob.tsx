import type { JobDocument, JobResult } from '../../lib/electrical';
import type { Finding } from '../../lib/electrical/types';
import type { ExplainedFinding } from '../../lib/documents/types';
import SeverityBadge, { SEVERITY_ORDER } from '../ui/SeverityBadge';

// Explanations are matched by what they say (code and words), which the stored revision keeps as it was.
const keyOf = (f: Pick<Finding, 'code' | 'message'>) => `${f.code}|${f.message}`;

/**
 * The panels and circuits of a revision as submitted, read from its stored document and results
 * (not the live job, which the contractor may have changed since).
 */
export function SubmittedPanels({
	document,
	results,
	onComment,
}: {
	document: JobDocument;
	results: JobResult;
	onComment?: (target: { kind: 'panel' | 'circuit'; id: string }) => void;
}) {
	const circuitResults = new Map(results.circuits.map((c) => [c.circuitId, c]));
	return (
		<div className="space-y-5" data-testid="submitted-panels">
			{document.panels.map((panel) => {
				const pr = results.panels.find((p) => p.panelId === panel.id);
				const circuits = document.circuits
					.filter((c) => c.panelId === panel.id)
					.sort((a, b) => a.position - b.position);
				return (
					<section key={panel.id} aria-label={`Panel ${panel.name}`}>
						<div className="flex flex-wrap items-baseline justify-between gap-2">
							<h3 className="font-bold text-ink-950">
								{panel.name}{' '}
								<span className="text-sm font-normal text-ink-600">
									{panel.kind === 'main' ? 'main panel' : 'subpanel'} · {panel.busRatingA} A bus
									{panel.mainBreakerA ? ` · ${panel.mainBreakerA} A main` : ''} · {panel.spaces} spaces
								</span>
							</h3>
							{onComment && (
								<button
									type="button"
									className="text-sm underline"
									onClick={() => onComment({ kind: 'panel', id: panel.id })}
								>
									Comment on this panel
								</button>
							)}
						</div>
						{pr && (
							<p className="text-sm text-ink-600">
								Calculated load {Math.round(pr.calculatedVA.value).toLocaleString('en-US')} VA (
								{pr.calculatedA.value.toFixed(1)} A) · {pr.used} of {pr.spaces} spaces used
							</p>
						)}
						<div className="mt-1 overflow-x-auto">
							<table className="w-full text-left text-sm">
								<thead className="text-xs uppercase tracking-wide text-ink-500">
									<tr>
										<th className="py-1 pr-2">Pos.</th>
										<th className="py-1 pr-2">Circuit</th>
										<th className="py-1 pr-2">Breaker</th>
										<th className="py-1 pr-2">Conductor</th>
										<th className="py-1 pr-2 text-right">Load</th>
										<th className="py-1 pr-2 text-right">V drop</th>
									</tr>
								</thead>
								<tbody className="divide-y divide-ink-100">
									{circuits.map((c) => {
										const r = circuitResults.get(c.id);
										const worst = r?.findings
											.map((f) => f.severity)
											.sort((a, b) => SEVERITY_ORDER.indexOf(a) - SEVERITY_ORDER.indexOf(b))[0];
										return (
											<tr key={c.id} data-circuit={c.id}>
												<td className="py-1 pr-2 font-mono">{r?.positions.join(', ') ?? c.position}</td>
												<td className="py-1 pr-2">
													{c.label}
													{worst && worst !== 'ok' && (
														<span className="ml-1 align-middle">
															<SeverityBadge severity={worst} compact />
														</span>
													)}
													{onComment && (
														<button
															type="button"
															className="ml-2 text-xs underline"
															onClick={() => onComment({ kind: 'circuit', id: c.id })}
															aria-label={`Comment on circuit ${c.position}: ${c.label}`}
														>
															Comment
														</button>
													)}
												</td>
												<td className="py-1 pr-2">
													{c.poles}P {c.ratingA} A {c.breakerType.toUpperCase()}
												</td>
												<td className="py-1 pr-2">
													{c.conductor.size} AWG {c.conductor.material === 'cu' ? 'Cu' : 'Al'}, {c.lengthFt}{' '}
													ft
												</td>
												<td className="py-1 pr-2 text-right font-mono">
													{r ? `${Math.round(r.connectedVA.value).toLocaleString('en-US')} VA` : '–'}
												</td>
												<td className="py-1 pr-2 text-right font-mono">
													{r ? `${r.voltageDrop.percent.value.toFixed(1)} %` : '–'}
												</td>
											</tr>
										);
									})}
								</tbody>
							</table>
						</div>
					</section>
				);
			})}
		</div>
	);
}

/** The findings of a revision as submitted, worst first, each with the contractor's explanation where one was given. */
export function SubmittedFindings({
	results,
	explanations,
}: {
	results: JobResult;
	explanations: ExplainedFinding[];
}) {
	const notes = new Map(explanations.map((e) => [keyOf(e), e.note]));
	const shown = results.findings
		.filter((f) => f.severity !== 'ok')
		.sort((a, b) => SEVERITY_ORDER.indexOf(a.severity) - SEVERITY_ORDER.indexOf(b.severity));
	if (shown.length === 0) {
		return <p className="text-signal-ok">The submission had no warnings or violations.</p>;
	}
	return (
		<ul className="divide-y divide-ink-100" data-testid="submitted-findings">
			{shown.map((f, i) => (
				<li key={`${keyOf(f)}-${i}`} className="flex items-start gap-3 py-2" data-finding={f.code}>
					<SeverityBadge severity={f.severity} />
					<div className="min-w-0 flex-1">
						<p className="text-ink-900">{f.message}</p>
						<p className="text-xs text-copper-700">{f.rule}</p>
						{notes.get(keyOf(f)) && (
							<p className="mt-1 rounded bg-ink-50 px-2 py-1 text-sm text-ink-800" data-testid="explanation">
								<span className="font-semibold">Contractor’s explanation:</span> {notes.get(keyOf(f))}
							</p>
						)}
					</div>
				</li>
			))}
		</ul>
	);
}
