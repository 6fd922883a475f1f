import { useCallback, useMemo, useState } from 'react';
import { api, ApiError, messageOf } from '../../lib/client/api-client';
import { computeTree, type CircuitRecord, type JobTree, type LoadRecord } from '../../lib/client/job-tree';
import { useResource } from '../../lib/client/use-resource';
import { engineMessageInWords } from '../../lib/client/engine-messages';
import { circuitDoc, loadDoc } from '../../lib/job-document';
import { circuitSchema, loadSchema, type BreakerType } from '../../lib/electrical/schema';
import { num } from '../../lib/electrical/format';
import { positionsTaken } from '../../lib/electrical/positions';
import { BREAKER_TYPE_LABELS } from '../../lib/schemas/circuit';
import ConfirmDialog from '../ui/ConfirmDialog';
import LoadState from '../ui/LoadState';
import Notice from '../ui/Notice';
import { worstSeverity } from '../ui/SeverityBadge';
import CircuitEditor from './CircuitEditor';
import type { CircuitFormInput, CircuitFormValues } from './editor-schema';
import PanelGrid, { type GridBreaker } from './PanelGrid';
import PanelTotals from './PanelTotals';
import ConflictNotice from '../job/ConflictNotice';
import FormField from '../auth/FormField';

interface Props {
	jobId: string;
	panelId: string;
	initialCircuitId?: string;
}

function formValuesOf(c: CircuitRecord, loads: LoadRecord[]): CircuitFormInput {
	const { id: _id, panelId: _panelId, ...circuit } = circuitDoc(c);
	return {
		...circuit,
		loads: loads
			.filter((l) => l.circuitId === c.id)
			.map((l) => {
				const { id: _loadId, circuitId: _circuitId, ...load } = loadDoc(l);
				return { record: { id: l.id, version: l.version }, load };
			}),
	};
}

function blankCircuit(position: number): CircuitFormInput {
	return {
		position,
		poles: 1,
		ratingA: 20 as never,
		breakerType: 'standard',
		conductor: { size: '12', material: 'cu', insulationC: 90 },
		lengthFt: 50,
		label: '',
		roomIds: [],
		status: 'new',
		multiwireWith: null,
		gfciAtDevice: false,
		afciAtDevice: false,
		loads: [],
	};
}

const DRAFT_ID = '__draft__';

/** The server names a load's field `loads.2.va`; the form holds it at `loads.2.load.va`. */
function formPaths(fields: Record<string, string[]>): Record<string, string[]> {
	return Object.fromEntries(
		Object.entries(fields).map(([k, v]) => [k.replace(/^loads\.(\d+)\.(?!load\.)/, 'loads.$1.load.'), v]),
	);
}

/** What a 409 says the circuit holds now, with its loads in a line, for the conflict notice. */
function conflictView(current: unknown): Record<string, unknown> {
	const { circuit, loads } = current as { circuit?: CircuitRecord; loads?: LoadRecord[] };
	if (!circuit) return current as Record<string, unknown>;
	const rating = (l: LoadRecord) =>
		l.va !== null ? `${num(l.va)} VA` : l.watts !== null ? `${num(l.watts)} W` : `${l.hp} hp`;
	return {
		...circuit,
		loadsNow: (loads ?? []).map((l) => `${l.quantity} × ${l.description || l.kind} ${rating(l)}`).join('; '),
	};
}

/**
 * The panelboard editor: the breaker positions, the selected circuit's form, and the panel's leg
 * totals and headroom, recomputed by the engine in the browser as you type.
 */
export default function PanelEditor({ jobId, panelId, initialCircuitId }: Props) {
	const tree = useResource(() => api<JobTree>(`/api/jobs/${jobId}/tree`), jobId);
	const t = tree.data;
	const panel = t?.panels.find((p) => p.id === panelId) ?? null;
	const [selected, setSelected] = useState<number | null>(null);
	const [selectedFromUrl, setSelectedFromUrl] = useState(false);
	const [draft, setDraft] = useState<CircuitFormInput | null>(null);
	const [conflict, setConflict] = useState<Record<string, unknown> | null>(null);
	const [notice, setNotice] = useState<string | null>(null);
	const [moveTo, setMoveTo] = useState('');
	const [deleting, setDeleting] = useState(false);
	const [busy, setBusy] = useState(false);
	const [editorKey, setEditorKey] = useState(0);
	const [dirty, setDirty] = useState(false);
	const [leavingFor, setLeavingFor] = useState<{ position: number | null } | null>(null);

	if (t && !selectedFromUrl) {
		setSelectedFromUrl(true);
		const c = initialCircuitId
			? t.circuits.find((x) => x.id === initialCircuitId && x.panelId === panelId)
			: undefined;
		if (c) setSelected(c.position);
	}

	const circuits = useMemo(() => (t ? t.circuits.filter((c) => c.panelId === panelId) : []), [t, panelId]);
	const current =
		selected === null
			? null
			: (circuits.find((c) => positionsTaken(c.position, c.poles).includes(selected)) ?? null);

	// The job with the form's values in place of the saved circuit (only values the schemas accept).
	const preview = useMemo(() => {
		if (!t || !panel) return null;
		if (!draft || selected === null) return t;
		const id = current?.id ?? DRAFT_ID;
		const { loads: draftLoads, ...draftCircuit } = draft;
		const c = circuitSchema.safeParse({ ...draftCircuit, id, panelId, roomIds: draftCircuit.roomIds ?? [] });
		if (!c.success) return t;
		const circuit: CircuitRecord = { ...c.data, jobId, version: current?.version ?? 0 };
		const loads: LoadRecord[] = [];
		(draftLoads ?? []).forEach((row, i) => {
			const l = loadSchema.safeParse({
				...row.load,
				id: row.record?.id ?? `${DRAFT_ID}-${i}`,
				circuitId: id,
			});
			if (l.success)
				loads.push({
					...l.data,
					va: l.data.va ?? null,
					watts: l.data.watts ?? null,
					hp: l.data.hp ?? null,
					jobId,
					version: 0,
				});
		});
		return {
			...t,
			circuits: current ? t.circuits.map((x) => (x.id === id ? circuit : x)) : [...t.circuits, circuit],
			loads: [...t.loads.filter((l) => l.circuitId !== id), ...loads],
		};
	}, [t, panel, draft, selected, current, jobId, panelId]);
	const engine = useMemo(() => (preview ? computeTree(preview) : null), [preview]);
	// Engine messages name records by id and by place in the job document; show circuits by
	// position and label, and loads by their row in their circuit's loads table, instead.
	const circuitWords = (c: CircuitRecord) =>
		`${c.position} (“${c.label || 'unlabelled'}”)${c.panelId === panelId ? '' : ` in another panel`}`;
	const named = (text: string) =>
		engineMessageInWords(text, (list, i) => {
			if (list === 'circuits') {
				const c = preview?.circuits[i];
				return c && `Circuit ${circuitWords(c)}`;
			}
			if (list !== 'loads') return undefined;
			const l = preview?.loads[i];
			const c = l && preview?.circuits.find((x) => x.id === l.circuitId);
			if (!l || !c) return undefined;
			const row = preview.loads.filter((x) => x.circuitId === c.id).indexOf(l) + 1;
			return `Circuit ${circuitWords(c)}, load ${row}`;
		}).replace(/"([0-9a-f-]{36}|__draft__)"/g, (all, id: string) => {
			const c = preview?.circuits.find((x) => x.id === id);
			return c ? circuitWords(c) : all;
		});
	const results = engine?.ok ? engine.results : null;
	const panelResult = results?.panels.find((p) => p.panelId === panelId) ?? null;

	const breakers: GridBreaker[] = (preview?.circuits ?? [])
		.filter((c) => c.panelId === panelId)
		.map((c) => {
			const r = results?.circuits.find((x) => x.circuitId === c.id);
			return {
				id: c.id,
				position: c.position,
				poles: c.poles,
				ratingA: c.ratingA,
				label: c.label,
				breakerType: c.breakerType,
				severity: r ? worstSeverity(r.findings.map((f) => f.severity)) : 'ok',
			};
		});

	const open = useCallback((p: number | null) => {
		setSelected(p);
		setDraft(null);
		setDirty(false);
		setConflict(null);
		setNotice(null);
		setMoveTo('');
		setEditorKey((k) => k + 1);
	}, []);

	// Leaving a circuit with unsaved edits (another position, or Close) asks first.
	const select = (p: number | null) => {
		if (dirty && p === selected) return;
		if (dirty) setLeavingFor({ position: p });
		else open(p);
	};

	const save = async (values: CircuitFormValues) => {
		if (!t) return;
		setConflict(null);
		const { loads: rows, ...circuitValues } = values;
		const loads = rows.map((r) => (r.record ? { ...r.load, ...r.record } : r.load));
		let saved: { circuit: CircuitRecord; loads: LoadRecord[] };
		try {
			if (current) {
				// Position and poles change only through "Move the breaker".
				const { position: _p, poles: _n, ...rest } = circuitValues;
				const kept = new Set(rows.map((r) => r.record?.id));
				const deleteLoads = t.loads
					.filter((l) => l.circuitId === current.id && !kept.has(l.id))
					.map((l) => ({ id: l.id, version: l.version }));
				saved = await api(`/api/circuits/${current.id}/with-loads`, {
					method: 'PUT',
					body: { ...rest, version: current.version, loads, deleteLoads },
				});
			} else {
				saved = await api(`/api/panels/${panelId}/circuits`, {
					method: 'POST',
					body: { ...circuitValues, loads },
				});
			}
		} catch (err) {
			if (err instanceof ApiError && err.status === 409 && err.current) {
				setConflict(conflictView(err.current));
				throw new ApiError(409, 'conflict', 'Nothing was saved.');
			}
			if (err instanceof ApiError && err.status === 400)
				throw new ApiError(400, err.code, err.message, formPaths(err.fields));
			throw err;
		}
		const { circuit } = saved;
		tree.setData((prev) => {
			const p = prev as JobTree;
			const exists = p.circuits.some((c) => c.id === circuit.id);
			return {
				...p,
				circuits: exists
					? p.circuits.map((c) => (c.id === circuit.id ? circuit : c))
					: [...p.circuits, circuit],
				loads: [...p.loads.filter((l) => l.circuitId !== circuit.id), ...saved.loads],
			};
		});
		setSelected(circuit.position);
		setDraft(null);
		setDirty(false);
		setEditorKey((k) => k + 1);
		setNotice(`Saved ${circuit.label || 'the circuit'}.`);
	};

	const move = async () => {
		if (!current || !moveTo) return;
		setBusy(true);
		setNotice(null);
		try {
			const { circuit } = await api<{ circuit: CircuitRecord }>(`/api/circuits/${current.id}/move`, {
				method: 'POST',
				body: { position: Number(moveTo), version: current.version },
			});
			tree.setData((prev) => ({
				...(prev as JobTree),
				circuits: (prev as JobTree).circuits.map((c) => (c.id === circuit.id ? circuit : c)),
			}));
			setSelected(circuit.position);
			setDraft(null);
			setDirty(false);
			setMoveTo('');
			setEditorKey((k) => k + 1);
			setNotice(
				`Moved ${circuit.label || 'the breaker'} to position ${positionsTaken(circuit.position, circuit.poles).join(' & ')}.`,
			);
		} catch (err) {
			if (err instanceof ApiError && err.status === 409 && err.current)
				setConflict(err.current as Record<string, unknown>);
			else setNotice(null);
			setMoveError(messageOf(err));
		} finally {
			setBusy(false);
		}
	};
	const [moveError, setMoveError] = useState<string | null>(null);

	const remove = async () => {
		if (!current) return;
		setBusy(true);
		try {
			await api(`/api/circuits/${current.id}`, { method: 'DELETE', body: { version: current.version } });
			tree.setData((prev) => {
				const p = prev as JobTree;
				return {
					...p,
					circuits: p.circuits.filter((c) => c.id !== current.id),
					loads: p.loads.filter((l) => l.circuitId !== current.id),
				};
			});
			setNotice(`Deleted ${current.label || 'the breaker'}.`);
			setSelected(null);
			setDraft(null);
			setDirty(false);
		} catch (err) {
			setNotice(messageOf(err));
		} finally {
			setBusy(false);
			setDeleting(false);
		}
	};

	// Positions the selected breaker could move to: every position it would take is free (or its own) and within the panel.
	const moveTargets = (() => {
		if (!current || !panel) return [];
		const taken = new Set(
			circuits.filter((c) => c.id !== current.id).flatMap((c) => positionsTaken(c.position, c.poles)),
		);
		const out: number[] = [];
		for (let p = 1; p <= panel.spaces; p++) {
			if (p === current.position) continue;
			const need = positionsTaken(p, current.poles);
			if (need.every((q) => q <= panel.spaces && !taken.has(q))) out.push(p);
		}
		return out;
	})();

	if (t && !panel) {
		return (
			<Notice tone="error">
				This panelboard is not part of the job any more.{' '}
				<a className="underline" href={`/contractor/jobs/${jobId}#panels`}>
					Back to the job
				</a>
			</Notice>
		);
	}

	return (
		<LoadState
			loading={tree.loading}
			error={tree.error}
			onRetry={tree.reload}
			what="the panelboard"
			hasData={!!t}
		>
			{t && panel && (
				<div className="space-y-4">
					<div>
						<p className="text-sm text-ink-500">
							<a href="/contractor/jobs" className="underline">
								Jobs
							</a>{' '}
							/{' '}
							<a href={`/contractor/jobs/${jobId}#panels`} className="underline">
								{t.job.name}
							</a>{' '}
							/
						</p>
						<h1 className="text-2xl font-bold tracking-tight text-ink-950">{panel.name}</h1>
						<p className="text-ink-600">
							{panel.kind === 'main' ? 'Main panel' : 'Subpanel'} · {panel.busRatingA} A bus ·{' '}
							{panel.mainBreakerA ? `${panel.mainBreakerA} A main breaker` : 'main-lug'} · {panel.spaces}{' '}
							spaces
							{panel.location && ` · ${panel.location}`}
						</p>
						<p className="mt-2 rounded-md border border-signal-warning/40 bg-amber-50 p-2 text-sm text-ink-900">
							Switch off and verify the panel is de-energised before touching it. Panel and service work is
							for licensed electricians and the utility.
						</p>
					</div>
					{notice && <Notice tone="ok">{notice}</Notice>}
					{engine && !engine.ok && (
						<Notice tone="info">
							The checks run once the job is complete enough: {engine.errors.map(named).join('; ')}
						</Notice>
					)}
					<div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(22rem,28rem)_1fr]">
						<div className="min-w-0 space-y-4">
							<PanelGrid
								spaces={panel.spaces}
								voltageSystem={panel.voltageSystem}
								breakers={breakers}
								selected={selected}
								onSelect={select}
							/>
							{panelResult && <PanelTotals panel={panel} result={panelResult} />}
							<a className="btn-quiet" href={`/api/panels/${panel.id}/circuits.csv`} download>
								Panel schedule (CSV)
							</a>
						</div>
						<div className="panel-card min-w-0">
							{selected === null ? (
								<p className="text-ink-600">
									Select a position (click it, or Tab to it and press Enter) to add a breaker or edit its
									circuit.
								</p>
							) : (
								<CircuitEditor
									key={editorKey}
									title={
										current
											? `Positions ${positionsTaken(current.position, current.poles).join(' & ')}: ${current.label || 'unlabelled circuit'}`
											: `New breaker at position ${selected}`
									}
									initial={current ? formValuesOf(current, t.loads) : blankCircuit(selected)}
									isNew={!current}
									rooms={t.rooms}
									result={results?.circuits.find((r) => r.circuitId === (current?.id ?? DRAFT_ID)) ?? null}
									onDraft={setDraft}
									onSave={save}
									onClose={() => select(null)}
									onDirty={setDirty}
									onDelete={current ? () => setDeleting(true) : undefined}
									conflict={
										conflict && (
											<ConflictNotice
												what="circuit"
												current={conflict}
												fields={[
													['label', 'Label'],
													['ratingA', 'Breaker (A)'],
													['position', 'Position'],
													['lengthFt', 'Length (ft)'],
													['breakerType', 'Type', (v) => BREAKER_TYPE_LABELS[v as BreakerType] ?? String(v)],
													['loadsNow', 'Loads'],
												]}
												onReload={async () => {
													setConflict(null);
													await tree.reload();
													setDraft(null);
													setDirty(false);
													setEditorKey((k) => k + 1);
												}}
											/>
										)
									}
									moveControl={
										current && (
											<div className="flex flex-wrap items-end gap-2 border-t border-ink-100 pt-3">
												<FormField id="move-to" label="Move to…">
													<select
														id="move-to"
														value={moveTo}
														onChange={(e) => setMoveTo(e.target.value)}
														className="field-input"
													>
														<option value="">Choose a free position</option>
														{moveTargets.map((p) => (
															<option key={p} value={p}>
																Position {positionsTaken(p, current.poles).join(' & ')}
															</option>
														))}
													</select>
												</FormField>
												<button
													type="button"
													className="btn-quiet"
													disabled={!moveTo || busy || dirty}
													onClick={move}
												>
													Move the breaker
												</button>
												{dirty && (
													<p className="w-full text-xs text-ink-500">
														Save or discard your changes to the circuit before moving the breaker.
													</p>
												)}
												{moveError && <p className="field-error w-full">{moveError}</p>}
											</div>
										)
									}
								/>
							)}
						</div>
					</div>
					<ConfirmDialog
						open={leavingFor !== null}
						title={
							current
								? `Discard the unsaved changes to circuit ${positionsTaken(current.position, current.poles).join(' & ')}?`
								: `Discard the new breaker at position ${selected}?`
						}
						body={
							leavingFor?.position == null
								? 'Your changes to this circuit and its loads have not been saved. Close it and lose them?'
								: `Your changes to this circuit and its loads have not been saved. Open position ${leavingFor.position} and lose them?`
						}
						confirmLabel="Discard the changes"
						cancelLabel="Keep editing"
						onConfirm={() => {
							const to = leavingFor?.position ?? null;
							setLeavingFor(null);
							open(to);
						}}
						onCancel={() => setLeavingFor(null)}
					/>
					<ConfirmDialog
						open={deleting}
						title={`Delete ${current?.label || 'this breaker'}?`}
						body="The breaker and every load on it are deleted. This cannot be undone."
						confirmLabel="Delete the breaker"
						busy={busy}
						onConfirm={remove}
						onCancel={() => setDeleting(false)}
					/>
				</div>
			)}
		</LoadState>
	);
}
