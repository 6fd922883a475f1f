import type { PanelResult } from '../../lib/electrical';
import type { PanelRecord } from '../../lib/client/job-tree';
import { num } from '../../lib/electrical/format';

/** The panel's leg totals, calculated load and headroom (live: recomputed as the form changes). */
export default function PanelTotals({ panel, result }: { panel: PanelRecord; result: PanelResult }) {
	const limit = panel.mainBreakerA ?? panel.busRatingA;
	const headroom = limit - result.calculatedA.value;
	const maxLeg = Math.max(limit, ...result.legs.map((l) => l.amps.value));
	return (
		<section className="panel-card" aria-labelledby="totals-h" data-testid="panel-totals" aria-live="polite">
			<h2 id="totals-h" className="font-bold text-ink-950">
				Leg totals and headroom
			</h2>
			<ul className="mt-2 space-y-2">
				{result.legs.map((l) => (
					<li key={l.leg} title={`${l.amps.rule}: ${l.amps.working}`}>
						<div className="flex justify-between text-sm">
							<span className="font-semibold">Leg {l.leg}</span>
							<span className="font-mono" data-testid={`leg-${l.leg}`}>
								{num(l.amps.value, 1)} A · {num(l.va.value, 0)} VA
							</span>
						</div>
						<div className="mt-0.5 h-2 rounded bg-ink-100">
							<div
								className="h-2 rounded bg-copper-500"
								style={{ width: `${Math.min(100, (l.amps.value / maxLeg) * 100)}%` }}
							/>
						</div>
					</li>
				))}
			</ul>
			<dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
				<dt className="text-ink-600">Imbalance</dt>
				<dd className="text-right font-mono" title={result.imbalance.working}>
					{num(result.imbalance.value, 1)} {result.imbalance.unit}
				</dd>
				<dt className="text-ink-600">Connected load</dt>
				<dd className="text-right font-mono" title={result.connectedA.working}>
					{num(result.connectedVA.value, 0)} VA
				</dd>
				<dt className="text-ink-600">Calculated load</dt>
				<dd className="text-right font-mono" title={result.calculatedA.working}>
					{num(result.calculatedA.value, 1)} A
				</dd>
				<dt className="text-ink-600">{panel.mainBreakerA ? 'Main breaker' : 'Bus rating'}</dt>
				<dd className="text-right font-mono">{limit} A</dd>
				<dt className="font-semibold text-ink-900">Headroom</dt>
				<dd
					className={`text-right font-mono font-semibold ${headroom < 0 ? 'text-signal-violation' : 'text-signal-ok'}`}
					data-testid="headroom"
				>
					{num(headroom, 1)} A
				</dd>
				<dt className="text-ink-600">Spaces</dt>
				<dd className="text-right font-mono">
					{result.used} used · {result.free} free
				</dd>
			</dl>
		</section>
	);
}
