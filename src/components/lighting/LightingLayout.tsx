import { useMemo, useState } from 'react';
import { api, messageOf } from '../../lib/client/api-client';
import type { JobTree } from '../../lib/client/job-tree';
import { useResource } from '../../lib/client/use-resource';
import { layoutRecessedLights, recessedLightLoads, type RecessedLayoutInput } from '../../lib/electrical';
import { num } from '../../lib/electrical/format';
import LoadState from '../ui/LoadState';
import Notice from '../ui/Notice';
import LayoutDrawing from './LayoutDrawing';
import FormField from '../auth/FormField';

interface Props {
	jobId: string;
}

interface Entry {
	roomId: string;
	lengthFt: string;
	widthFt: string;
	ceilingHeightFt: string;
	fixtureDiameterIn: string;
	watts: string;
	wallOffsetFt: string;
	useCount: boolean;
	rows: string;
	columns: string;
	joists: 'none' | 'along-length' | 'along-width';
	joistSpacingIn: string;
	joistFirstOffsetIn: string;
}

const START: Entry = {
	roomId: '',
	lengthFt: '14',
	widthFt: '12',
	ceilingHeightFt: '8',
	fixtureDiameterIn: '6',
	watts: '12',
	wallOffsetFt: '',
	useCount: false,
	rows: '2',
	columns: '3',
	joists: 'along-width',
	joistSpacingIn: '16',
	joistFirstOffsetIn: '16',
};

const n = (s: string) => (s.trim() === '' ? undefined : Number(s));

function toInput(e: Entry): RecessedLayoutInput {
	return {
		lengthFt: n(e.lengthFt) as number,
		widthFt: n(e.widthFt) as number,
		ceilingHeightFt: n(e.ceilingHeightFt) as number,
		fixtureDiameterIn: n(e.fixtureDiameterIn) as number,
		wallOffsetFt: e.wallOffsetFt.trim() === '' ? null : Number(e.wallOffsetFt),
		spacing: e.useCount
			? { rule: 'count', rows: n(e.rows) as number, columns: n(e.columns) as number }
			: { rule: 'half-ceiling-height' },
		joists:
			e.joists === 'none'
				? null
				: {
						direction: e.joists,
						spacingIn: n(e.joistSpacingIn) as number,
						firstOffsetIn: n(e.joistFirstOffsetIn) as number,
					},
	};
}

/** Messages of the engine ("joists.spacingIn: must be …") keyed by the field they belong to. */
function byField(errors: string[]): Record<string, string> {
	const map: Record<string, string> = {};
	const keys: [string, keyof Entry][] = [
		['lengthFt', 'lengthFt'],
		['widthFt', 'widthFt'],
		['ceilingHeightFt', 'ceilingHeightFt'],
		['fixtureDiameterIn', 'fixtureDiameterIn'],
		['wallOffsetFt', 'wallOffsetFt'],
		['spacing.rows', 'rows'],
		['spacing.columns', 'columns'],
		['joists.spacingIn', 'joistSpacingIn'],
		['joists.firstOffsetIn', 'joistFirstOffsetIn'],
	];
	for (const line of errors) {
		const hit = keys.find(([path]) => line.startsWith(`${path}:`));
		const field = hit ? hit[1] : '_';
		map[field] ??= hit ? line.slice(hit[0].length + 1).trim() : line;
	}
	return map;
}

/** A room's recessed-light layout drawn to scale, and its fixtures added as a lighting load on a circuit. */
export default function LightingLayout({ jobId }: Props) {
	const tree = useResource(() => api<JobTree>(`/api/jobs/${jobId}/tree`), jobId);
	const [entry, setEntry] = useState<Entry>(START);
	const [circuitId, setCircuitId] = useState('');
	const [saving, setSaving] = useState(false);
	const [saved, setSaved] = useState<string | null>(null);
	const [saveError, setSaveError] = useState<string | null>(null);
	const set = (k: keyof Entry) => (ev: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => {
		const v = ev.target.type === 'checkbox' ? (ev.target as HTMLInputElement).checked : ev.target.value;
		setEntry((e) => ({ ...e, [k]: v }));
		setSaved(null);
	};

	const result = useMemo(() => layoutRecessedLights(toInput(entry)), [entry]);
	const wattsOk = Number(entry.watts) > 0 && Number.isFinite(Number(entry.watts));
	const problems = result.ok ? {} : byField(result.errors);
	if (!wattsOk) problems.watts = 'must be more than 0 W';

	const t = tree.data;
	const rooms = t?.rooms ?? [];
	const circuits = (t?.circuits ?? []).filter((c) => c.poles === 1);
	const panelName = (id: string) => t?.panels.find((p) => p.id === id)?.name ?? '';

	const addLoads = async () => {
		if (!result.ok || !wattsOk || !circuitId) return;
		setSaving(true);
		setSaveError(null);
		setSaved(null);
		try {
			const [load] = recessedLightLoads(result.layout, {
				circuitId,
				vaPerFixture: Number(entry.watts),
				roomIds: entry.roomId ? [entry.roomId] : [],
			});
			if (!load) return;
			const { id: _id, circuitId: _c, ...body } = load;
			await api(`/api/circuits/${circuitId}/loads`, { method: 'POST', body });
			const c = circuits.find((x) => x.id === circuitId);
			setSaved(
				`Added ${result.layout.count} fixtures (${num(result.layout.count * Number(entry.watts))} W) to ${c?.label || 'the circuit'}.`,
			);
		} catch (err) {
			setSaveError(messageOf(err));
		} finally {
			setSaving(false);
		}
	};

	const field = (k: keyof Entry, label: string, unit?: string) => (
		<div>
			<label htmlFor={`rl-${k}`} className="field-label">
				{label}
				{unit && <span className="font-normal text-ink-500"> ({unit})</span>}
			</label>
			<input
				id={`rl-${k}`}
				inputMode="decimal"
				value={entry[k] as string}
				onChange={set(k)}
				aria-invalid={problems[k] ? true : undefined}
				aria-describedby={problems[k] ? `rl-${k}-error` : undefined}
				className="field-input"
			/>
			{problems[k] && (
				<p id={`rl-${k}-error`} className="field-error">
					{problems[k]}
				</p>
			)}
		</div>
	);

	return (
		<LoadState loading={tree.loading} error={tree.error} onRetry={tree.reload} what="the job" hasData={!!t}>
			{t && (
				<div className="grid grid-cols-1 gap-4 lg:grid-cols-[24rem_1fr]">
					<form
						className="panel-card space-y-3"
						aria-label="Room and fixtures"
						onSubmit={(e) => e.preventDefault()}
					>
						<FormField id="rl-roomId" label="Room">
							<select
								id="rl-roomId"
								value={entry.roomId}
								onChange={(ev) => {
									const room = rooms.find((r) => r.id === ev.target.value);
									setEntry((e) => ({ ...e, roomId: ev.target.value }));
									if (room && room.areaFt2 > 0 && !entry.lengthFt)
										setEntry((e) => ({ ...e, lengthFt: String(Math.sqrt(room.areaFt2).toFixed(1)) }));
								}}
								className="field-input"
							>
								<option value="">No room chosen</option>
								{rooms.map((r) => (
									<option key={r.id} value={r.id}>
										{r.name} ({r.areaFt2} ft²)
									</option>
								))}
							</select>
						</FormField>
						<div className="grid grid-cols-2 gap-3">
							{field('lengthFt', 'Length', 'ft')}
							{field('widthFt', 'Width', 'ft')}
							{field('ceilingHeightFt', 'Ceiling height', 'ft')}
							{field('wallOffsetFt', 'Wall offset', 'ft, empty: half the spacing')}
							{field('fixtureDiameterIn', 'Fixture size', 'in')}
							{field('watts', 'Watts each', 'W')}
						</div>
						<fieldset className="space-y-2">
							<legend className="field-label">Rows and columns</legend>
							<label className="inline-flex items-center gap-2 text-sm">
								<input
									type="checkbox"
									checked={entry.useCount}
									onChange={set('useCount')}
									className="h-4 w-4 accent-copper-600"
								/>
								Choose rows × columns myself (otherwise spacing about half the ceiling height)
							</label>
							{entry.useCount && (
								<div className="grid grid-cols-2 gap-3">
									{field('rows', 'Rows')}
									{field('columns', 'Columns')}
								</div>
							)}
						</fieldset>
						<fieldset className="space-y-2">
							<legend className="field-label">Ceiling joists</legend>
							<select
								id="rl-joists"
								aria-label="Joist direction"
								value={entry.joists}
								onChange={set('joists')}
								className="field-input"
							>
								<option value="along-width">Run across the room (along the width)</option>
								<option value="along-length">Run along the length</option>
								<option value="none">No joists to clear</option>
							</select>
							{entry.joists !== 'none' && (
								<div className="grid grid-cols-2 gap-3">
									{field('joistSpacingIn', 'Spacing on centre', 'in')}
									{field('joistFirstOffsetIn', 'First joist from wall', 'in')}
								</div>
							)}
						</fieldset>
						{problems._ && <Notice tone="error">{problems._}</Notice>}
					</form>

					<div className="space-y-4">
						<section className="panel-card" aria-labelledby="drawing-h">
							<h2 id="drawing-h" className="font-bold text-ink-950">
								Layout
								{result.ok &&
									`: ${result.layout.count} fixtures (${result.layout.rows} × ${result.layout.columns})`}
							</h2>
							{result.ok ? (
								<>
									<LayoutDrawing
										lengthFt={Number(entry.lengthFt)}
										widthFt={Number(entry.widthFt)}
										layout={result.layout}
										fixtureDiameterIn={Number(entry.fixtureDiameterIn)}
										joistsAlong={entry.joists}
									/>
									<dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-3">
										{[
											['Spacing along the length', result.layout.spacingX],
											['Spacing along the width', result.layout.spacingY],
											['From the end walls', result.layout.wallOffsetX],
											['From the side walls', result.layout.wallOffsetY],
											...(result.layout.joistClearance
												? [['Clearance to joists', result.layout.joistClearance] as const]
												: []),
										].map(([label, f]) => (
											<div
												key={label as string}
												title={typeof f === 'object' ? `${f.rule}: ${f.working}` : ''}
											>
												<dt className="text-xs text-ink-500">{label as string}</dt>
												<dd className="font-mono font-semibold">
													{typeof f === 'object' ? `${num(f.value)} ${f.unit}` : ''}
												</dd>
											</div>
										))}
									</dl>
									{result.layout.notes.length > 0 && (
										<ul
											className="mt-3 list-disc space-y-0.5 pl-5 text-sm text-ink-700"
											data-testid="layout-notes"
										>
											{result.layout.notes.map((note) => (
												<li key={note}>{note}</li>
											))}
										</ul>
									)}
								</>
							) : (
								<p className="mt-2 text-ink-600">Correct the marked fields to see the layout.</p>
							)}
						</section>

						<section className="panel-card" aria-labelledby="add-h">
							<h2 id="add-h" className="font-bold text-ink-950">
								Add the fixtures to a branch circuit
							</h2>
							{circuits.length === 0 ? (
								<p className="mt-1 text-ink-600">
									The job has no 120 V branch circuits yet. Add one in a{' '}
									<a className="underline" href={`/contractor/jobs/${jobId}#panels`}>
										panelboard
									</a>
									.
								</p>
							) : (
								<div className="mt-2 flex flex-wrap items-end gap-2">
									<div className="min-w-[16rem] flex-1">
										<label htmlFor="rl-circuit" className="field-label">
											Circuit
										</label>
										<select
											id="rl-circuit"
											value={circuitId}
											onChange={(e) => setCircuitId(e.target.value)}
											className="field-input"
										>
											<option value="">Choose a circuit…</option>
											{circuits.map((c) => (
												<option key={c.id} value={c.id}>
													{panelName(c.panelId)} #{c.position}: {c.label || 'unlabelled'} ({c.ratingA} A)
												</option>
											))}
										</select>
									</div>
									<button
										type="button"
										className="btn-primary"
										disabled={!result.ok || !wattsOk || !circuitId || saving}
										onClick={addLoads}
									>
										{saving ? 'Adding…' : `Add ${result.ok ? result.layout.count : ''} fixtures as loads`}
									</button>
								</div>
							)}
							<div className="mt-2 space-y-2">
								{saved && <Notice tone="ok">{saved}</Notice>}
								{saveError && <Notice tone="error">{saveError}</Notice>}
							</div>
						</section>
					</div>
				</div>
			)}
		</LoadState>
	);
}
