/**
 * What changed between two submitted revisions of a job: rooms, panels, circuits and loads added,
 * removed or changed field by field, the calculation figures before and after, and which review
 * comments each change answers. Pure: it reads the revisions' stored JSON and the comments, nothing else.
 */
import { create, type Delta } from 'jsondiffpatch';
import type { JobResult } from '../electrical';
import type { JobDocument } from '../electrical/schema';

export type RecordKind = 'job' | 'room' | 'panel' | 'circuit' | 'load';
export type ChangeKind = 'added' | 'removed' | 'changed';

/** A revision as the diff reads it: the document and the engine's results as stored (parsed JSON). */
export interface RevisionSnapshot {
	number: number;
	document: JobDocument;
	/** The stored results JSON; null when the stored results could not be read. */
	results: JobResult | null;
	submittedAt: string;
}

/** A review comment and the contractor's answers on it, as the diff maps them to changes. */
export interface CommentForDiff {
	id: string;
	revisionNumber: number;
	targetKind: 'sheet' | 'panel' | 'circuit' | 'job';
	panelId: string | null;
	circuitId: string | null;
	targetLabel: string;
	sheet: number | null;
	body: string;
	status: string;
	answers: { body: string; authorName: string | null; at: string }[];
}

export interface FieldChange {
	/** The record's field ("ratingA", "conductor", "roomIds", "service.ratingA", ...). */
	field: string;
	before: unknown;
	after: unknown;
}

export interface RecordChange {
	/** Stable key of the change: `${kind}:${id}`. */
	key: string;
	kind: RecordKind;
	id: string;
	change: ChangeKind;
	/** The record as it is named in the revision that has it (the later one when both do). */
	title: string;
	/** The name it had before, when that differs. */
	titleBefore: string | null;
	/** The panel the record is on (for circuits and loads), before and after. */
	panelIds: string[];
	/** The circuit the record is on (for circuits: itself; for loads: its circuit), before and after. */
	circuitIds: string[];
	fields: FieldChange[];
	/** The whole record for an added or removed one, so that the screen can show what it was. */
	before: Record<string, unknown> | null;
	after: Record<string, unknown> | null;
	/** Ids of the review comments this change answers. */
	answers: string[];
}

export interface FigureChange {
	key: string;
	group: 'service' | 'panel' | 'findings';
	/** For panel figures, the panel's id. */
	panelId: string | null;
	label: string;
	unit: string;
	before: number | null;
	after: number | null;
	changed: boolean;
}

export interface RevisionChanges {
	from: number | null;
	to: number;
	fromSubmittedAt: string | null;
	toSubmittedAt: string;
	records: RecordChange[];
	figures: FigureChange[];
	comments: (CommentForDiff & { answeredBy: string[] })[];
	/** What each room, panel and circuit id of either revision is called, for showing references in words. */
	names: Record<string, string>;
}

type Rec = Record<string, unknown> & { id: string };

const differ = create({
	// Records match by their id, so a panel that moved in the list is the same panel.
	objectHash: (item: object, index?: number) => {
		const id = (item as { id?: unknown }).id;
		return typeof id === 'string' ? id : `$index:${index ?? 0}`;
	},
	arrays: { detectMove: true, includeValueOnMove: false },
});

const METHOD_NAMES: Record<string, string> = {
	standard: 'Standard method',
	optional: 'Optional method',
	'existing-added': 'Existing dwelling, load added',
	'measured-demand': 'Measured demand',
};

function recordTitle(kind: RecordKind, r: Rec | undefined): string {
	if (!r) return '';
	const name = (field: string) => (typeof r[field] === 'string' && r[field] ? `“${r[field] as string}”` : '');
	switch (kind) {
		case 'room':
			return `Room ${name('name')}`.trim();
		case 'panel':
			return `Panel ${name('name')}`.trim();
		case 'circuit':
			return `Circuit ${String(r.position)} ${name('label')}`.trim();
		case 'load':
			return `Load ${name('description') || `(${String(r.kind)})`}`.trim();
		default:
			return 'Job';
	}
}

const normalised = (v: unknown): string =>
	JSON.stringify(Array.isArray(v) && v.every((x) => typeof x === 'string') ? [...v].sort() : (v ?? null));

/** The fields of two versions of a record that differ (arrays of ids compared as sets). */
function fieldChanges(before: Rec, after: Rec, delta: Record<string, unknown>): FieldChange[] {
	return Object.keys(delta)
		.filter((k) => k !== 'id' && k !== '_t')
		.filter((k) => normalised(before[k]) !== normalised(after[k]))
		.map((field) => ({ field, before: before[field] ?? null, after: after[field] ?? null }));
}

/** Ids of added, removed and changed records of one array, read from jsondiffpatch's array delta. */
function arrayChanges(delta: Delta | undefined, oldList: Rec[], newList: Rec[]) {
	const added: Rec[] = [];
	const removed: Rec[] = [];
	const changed: { before: Rec; after: Rec; delta: Record<string, unknown> }[] = [];
	if (!delta || typeof delta !== 'object' || Array.isArray(delta)) return { added, removed, changed };
	const d = delta as Record<string, unknown>;
	for (const [key, value] of Object.entries(d)) {
		if (key === '_t' || typeof value !== 'object' || value === null) continue;
		if (key.startsWith('_')) {
			// [old, 0, 0] is a removal; ['', to, 3] a move, which is no change of the record.
			if (Array.isArray(value) && value.length === 3 && value[2] === 0) removed.push(value[0] as Rec);
			continue;
		}
		if (Array.isArray(value) && value.length === 1) {
			added.push(value[0] as Rec);
			continue;
		}
		if (Array.isArray(value) && value.length === 2) {
			// A replaced item: with records matched by id this is a record whose id changed.
			removed.push(value[0] as Rec);
			added.push(value[1] as Rec);
			continue;
		}
		const after = newList[Number(key)];
		const before = after && oldList.find((r) => r.id === after.id);
		if (after && before) changed.push({ before, after, delta: value as Record<string, unknown> });
	}
	return { added, removed, changed };
}

/** The job-level settings a reviewer cares about, flattened so one delta key is one field. */
function jobSettings(doc: JobDocument): Rec {
	return {
		id: 'job',
		name: doc.name,
		address: doc.address,
		codeEdition: doc.codeEdition,
		floorAreaFt2: doc.floorAreaFt2 ?? null,
		terminalTemperatureC: doc.terminalTemperatureC,
		'service.ratingA': doc.service.ratingA,
		'service.voltageSystem': doc.service.voltageSystem,
		'service.existingLoad': doc.service.existingLoad ?? null,
	};
}

const valueOf = (f: unknown): number | null =>
	f && typeof f === 'object' && typeof (f as { value?: unknown }).value === 'number'
		? (f as { value: number }).value
		: null;

type FigureDef = Omit<FigureChange, 'before' | 'after' | 'changed'> & { value: number | null };

/** The calculation figures of a revision, keyed so that the same figure of two revisions meets. */
function figuresOf(results: JobResult | null, doc: JobDocument): Map<string, FigureDef> {
	const out = new Map<string, FigureDef>();
	if (!results) return out;
	const add = (f: FigureDef) => out.set(f.key, f);
	const service = results.service;
	if (service) {
		add({
			key: 'service.minimumServiceA',
			group: 'service',
			panelId: null,
			label: 'Minimum service rating',
			unit: 'A',
			value: valueOf(service.minimumServiceA),
		});
		for (const m of service.methods ?? []) {
			if (!m.applicable) continue;
			const name = METHOD_NAMES[m.method] ?? m.title;
			const fig = (suffix: string, label: string, unit: string, f: unknown) =>
				add({
					key: `service.${m.method}.${suffix}`,
					group: 'service',
					panelId: null,
					label: `${name}: ${label}`,
					unit,
					value: valueOf(f),
				});
			fig('totalVA', 'calculated load', 'VA', m.totalVA);
			fig('amps', 'load current', 'A', m.amps);
			fig('minimumServiceA', 'minimum service', 'A', m.minimumServiceA);
			fig('headroomA', 'headroom', 'A', m.headroomA);
		}
	}
	for (const p of results.panels ?? []) {
		const name = doc.panels.find((x) => x.id === p.panelId)?.name ?? p.name;
		const fig = (suffix: string, label: string, unit: string, value: number | null) =>
			add({
				key: `panel.${p.panelId}.${suffix}`,
				group: 'panel',
				panelId: p.panelId,
				label: `Panel “${name}”: ${label}`,
				unit,
				value,
			});
		fig('connectedVA', 'connected load', 'VA', valueOf(p.connectedVA));
		fig('calculatedVA', 'calculated load', 'VA', valueOf(p.calculatedVA));
		fig('calculatedA', 'calculated current', 'A', valueOf(p.calculatedA));
		fig('used', 'spaces used', 'count', typeof p.used === 'number' ? p.used : null);
	}
	const summary = results.summary;
	if (summary) {
		for (const [severity, label] of [
			['violation', 'Violations'],
			['warning', 'Warnings'],
		] as const) {
			add({
				key: `findings.${severity}`,
				group: 'findings',
				panelId: null,
				label,
				unit: 'count',
				value: typeof summary[severity] === 'number' ? summary[severity] : null,
			});
		}
	}
	return out;
}

/** Figures of both revisions, in the later revision's order, with what only the earlier had at the end. */
function figureChanges(before: RevisionSnapshot | null, after: RevisionSnapshot): FigureChange[] {
	const a = before ? figuresOf(before.results, before.document) : new Map<string, FigureDef>();
	const b = figuresOf(after.results, after.document);
	const keys = [...b.keys(), ...[...a.keys()].filter((k) => !b.has(k))];
	return keys.map((key) => {
		const def = (b.get(key) ?? a.get(key))!;
		const beforeValue = a.get(key)?.value ?? null;
		const afterValue = b.get(key)?.value ?? null;
		const { value: _value, ...rest } = def;
		return { ...rest, before: beforeValue, after: afterValue, changed: beforeValue !== afterValue };
	});
}

/** Whether a change touches what a comment is pinned to: the panel or circuit itself, or the circuit's panel. */
function answers(change: RecordChange, c: CommentForDiff): boolean {
	if (c.targetKind === 'circuit' && c.circuitId) return change.circuitIds.includes(c.circuitId);
	if (c.targetKind === 'panel' && c.panelId) {
		return (change.kind === 'panel' && change.id === c.panelId) || change.panelIds.includes(c.panelId);
	}
	return false;
}

function namesOf(before: RevisionSnapshot | null, after: RevisionSnapshot): Record<string, string> {
	const names: Record<string, string> = {};
	for (const snap of [before, after]) {
		if (!snap) continue;
		const d = snap.document;
		for (const r of d.rooms) names[r.id] = r.name;
		for (const p of d.panels) names[p.id] = recordTitle('panel', p as unknown as Rec);
		for (const c of d.circuits) names[c.id] = recordTitle('circuit', c as unknown as Rec);
	}
	return names;
}

/**
 * The changes from revision `before` to revision `after` (before is null for the first submission,
 * when there is nothing to compare), with the review comments made up to `before` mapped to the
 * changes that answer them.
 */
export function diffRevisions(
	before: RevisionSnapshot | null,
	after: RevisionSnapshot,
	comments: readonly CommentForDiff[] = [],
): RevisionChanges {
	const records: RecordChange[] = [];
	if (before) {
		const oldDoc = before.document;
		const newDoc = after.document;
		const circuitPanel = (id: unknown, doc: JobDocument) =>
			doc.circuits.find((c) => c.id === id)?.panelId ?? null;
		const context = (kind: RecordKind, r: Rec | undefined, doc: JobDocument) => {
			if (!r) return { panels: [] as string[], circuits: [] as string[] };
			if (kind === 'circuit') return { panels: [String(r.panelId)], circuits: [r.id] };
			if (kind === 'load') {
				const panel = circuitPanel(r.circuitId, doc);
				return { panels: panel ? [panel] : [], circuits: [String(r.circuitId)] };
			}
			if (kind === 'panel') return { panels: [r.id], circuits: [] };
			return { panels: [], circuits: [] };
		};
		const push = (
			kind: RecordKind,
			change: ChangeKind,
			b: Rec | undefined,
			a: Rec | undefined,
			fields: FieldChange[],
		) => {
			const cb = context(kind, b, oldDoc);
			const ca = context(kind, a, newDoc);
			const title = recordTitle(kind, a ?? b);
			const titleBefore = b && a ? recordTitle(kind, b) : null;
			records.push({
				key: `${kind}:${(a ?? b)!.id}`,
				kind,
				id: (a ?? b)!.id,
				change,
				title,
				titleBefore: titleBefore && titleBefore !== title ? titleBefore : null,
				panelIds: [...new Set([...cb.panels, ...ca.panels])],
				circuitIds: [...new Set([...cb.circuits, ...ca.circuits])],
				fields,
				before: change === 'added' ? null : (b ?? null),
				after: change === 'removed' ? null : (a ?? null),
				answers: [],
			});
		};

		const oldJob = jobSettings(oldDoc);
		const newJob = jobSettings(newDoc);
		const jobDelta = differ.diff(oldJob, newJob) as Record<string, unknown> | undefined;
		if (jobDelta) {
			const fields = fieldChanges(oldJob, newJob, jobDelta);
			if (fields.length) push('job', 'changed', oldJob, newJob, fields);
		}

		const lists: [RecordKind, keyof Pick<JobDocument, 'rooms' | 'panels' | 'circuits' | 'loads'>][] = [
			['room', 'rooms'],
			['panel', 'panels'],
			['circuit', 'circuits'],
			['load', 'loads'],
		];
		const delta = differ.diff(
			Object.fromEntries(lists.map(([, k]) => [k, oldDoc[k]])),
			Object.fromEntries(lists.map(([, k]) => [k, newDoc[k]])),
		) as Record<string, Delta> | undefined;
		for (const [kind, k] of lists) {
			const oldList = oldDoc[k] as unknown as Rec[];
			const newList = newDoc[k] as unknown as Rec[];
			const { added, removed, changed } = arrayChanges(delta?.[k], oldList, newList);
			for (const c of changed) {
				const fields = fieldChanges(c.before, c.after, c.delta);
				if (fields.length) push(kind, 'changed', c.before, c.after, fields);
			}
			for (const r of added) push(kind, 'added', undefined, r, []);
			for (const r of removed) push(kind, 'removed', r, undefined, []);
		}
		const order: Record<RecordKind, number> = { job: 0, panel: 1, circuit: 2, load: 3, room: 4 };
		const position = (r: RecordChange) => Number((r.after ?? r.before)?.position ?? 0);
		records.sort(
			(x, y) => order[x.kind] - order[y.kind] || position(x) - position(y) || x.title.localeCompare(y.title),
		);
	}

	const mapped = comments
		.filter((c) => before !== null && c.revisionNumber <= before.number)
		.map((c) => {
			const answeredBy = records.filter((r) => answers(r, c)).map((r) => r.key);
			for (const r of records) if (answeredBy.includes(r.key)) r.answers.push(c.id);
			return { ...c, answeredBy };
		});

	return {
		from: before?.number ?? null,
		to: after.number,
		fromSubmittedAt: before?.submittedAt ?? null,
		toSubmittedAt: after.submittedAt,
		records,
		figures: figureChanges(before, after),
		comments: mapped,
		names: namesOf(before, after),
	};
}
