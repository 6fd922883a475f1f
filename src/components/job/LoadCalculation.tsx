import { LIMITS_NOTICE } from '../../lib/cautions';
import type { MethodResult, ServiceResult } from '../../lib/electrical/compute-job';
import { num } from '../../lib/electrical/format';
import type { Figure, Line } from '../../lib/electrical/types';

function value(f: Figure): string {
	return f.unit === 'count' ? num(f.value) : `${num(f.value)} ${f.unit}`;
}

function Step({ line }: { line: Line }) {
	return (
		<li className="py-2">
			<div className="flex items-baseline justify-between gap-3">
				<span className="font-semibold text-ink-900">{line.label}</span>
				<span className="whitespace-nowrap font-mono text-sm font-semibold text-ink-950">{value(line)}</span>
			</div>
			<p className="font-mono text-xs text-ink-600">{line.working}</p>
			<p className="text-xs text-copper-700">{line.rule}</p>
		</li>
	);
}

function Result({ label, f }: { label: string; f: Figure | null }) {
	if (!f) return null;
	return (
		<div className="flex items-baseline justify-between gap-3 py-1" title={`${f.rule}: ${f.working}`}>
			<dt className="text-ink-700">{label}</dt>
			<dd className="font-mono font-semibold text-ink-950">{value(f)}</dd>
		</div>
	);
}

function Method({ m, lowest }: { m: MethodResult; lowest: boolean }) {
	return (
		<section
			aria-label={m.title}
			data-method={m.method}
			className={`flex flex-col rounded-md border p-4 ${m.applicable ? 'border-ink-200 bg-white' : 'border-dashed border-ink-200 bg-ink-50'}`}
		>
			<header>
				<h3 className="font-bold text-ink-950">{m.title}</h3>
				<p className="text-xs font-semibold text-copper-700">{m.rule}</p>
				<p className="mt-1 text-sm text-ink-600">{m.reason}</p>
				{lowest && (
					<p className="mt-1 inline-block rounded bg-copper-100 px-2 py-0.5 text-xs font-semibold text-copper-800">
						Lowest applicable result
					</p>
				)}
			</header>
			{m.applicable && (
				<>
					<ol className="mt-2 divide-y divide-ink-100">
						{m.lines.map((l) => (
							<Step key={l.key} line={l} />
						))}
					</ol>
					<dl className="mt-auto border-t-2 border-ink-800 pt-2 text-sm">
						<Result label="Calculated load" f={m.totalVA} />
						<Result label="Current" f={m.amps} />
						<Result label="Rounded (Annex D)" f={m.ampsRounded} />
						<Result label="Headroom on the service" f={m.headroomA} />
						{m.withinService !== null && (
							<p
								className={`mt-1 font-semibold ${m.withinService ? 'text-signal-ok' : 'text-signal-violation'}`}
							>
								{m.withinService ? 'Within the service rating' : 'Exceeds the service rating'}
							</p>
						)}
					</dl>
				</>
			)}
		</section>
	);
}

/** The dwelling service load calculation: each method side by side, every step with its section and arithmetic. */
export default function LoadCalculation({ service }: { service: ServiceResult }) {
	const applicable = service.methods.filter((m) => m.applicable);
	const notApplicable = service.methods.filter((m) => !m.applicable);
	return (
		<div className="space-y-4" data-testid="load-calculation">
			<p className="rounded-md border border-signal-warning/40 bg-amber-50 p-3 text-sm text-ink-900">
				{LIMITS_NOTICE}
			</p>
			<div className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
				<span>
					<span className="text-ink-500">Service:</span> <strong>{service.ratingA} A</strong>
				</span>
				<span title={`${service.floorArea.rule}: ${service.floorArea.working}`}>
					<span className="text-ink-500">Floor area:</span> <strong>{value(service.floorArea)}</strong>
				</span>
				<span title={`${service.minimumServiceA.rule}: ${service.minimumServiceA.working}`}>
					<span className="text-ink-500">Minimum service:</span>{' '}
					<strong>{value(service.minimumServiceA)}</strong>
				</span>
			</div>
			<div className={`grid gap-4 ${applicable.length >= 3 ? 'xl:grid-cols-3' : ''} lg:grid-cols-2`}>
				{applicable.map((m) => (
					<Method key={m.method} m={m} lowest={service.lowestMethod === m.method} />
				))}
			</div>
			{notApplicable.length > 0 && (
				<details className="rounded-md border border-ink-200 bg-ink-50 p-3 text-sm">
					<summary className="cursor-pointer font-semibold text-ink-800">
						Methods that do not apply here ({notApplicable.length})
					</summary>
					<ul className="mt-2 space-y-1">
						{notApplicable.map((m) => (
							<li key={m.method}>
								<strong>{m.title}</strong> <span className="text-copper-700">({m.rule})</span>: {m.reason}
							</li>
						))}
					</ul>
				</details>
			)}
			<details className="rounded-md border border-ink-200 p-3 text-sm">
				<summary className="cursor-pointer font-semibold text-ink-800">
					Neutral load (220.61): {value(service.neutral.ampsRounded)}
				</summary>
				<ol className="mt-2 divide-y divide-ink-100">
					{service.neutral.lines.map((l) => (
						<Step key={l.key} line={l} />
					))}
				</ol>
			</details>
		</div>
	);
}
