import type { Knex } from 'knex';
import { crossCheck } from '../electrical/parse';
import { errors } from '../errors';
import { jobDocumentFromRows, type JobTree } from '../job-document';
import { loadJobTree } from './jobs';

const UUID = /"?([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})"?/gi;

type Collection = 'rooms' | 'panels' | 'circuits' | 'loads';

interface Problem {
	/** The problem with document indexes replaced by ids, so that it compares across writes. */
	key: string;
	collection: Collection | null;
	entityId: string | null;
	/** The record the problem is on, in people's words. */
	subject: string | null;
	/** Dotted field path inside the entity ('' for the entity as a whole). */
	field: string;
	message: string;
}

/** How a record is named inside a message (inline) and at the head of one (subject). */
function displayNames(tree: JobTree): { inline: Map<string, string>; subject: Map<string, string> } {
	const inline = new Map<string, string>();
	const subject = new Map<string, string>();
	for (const r of tree.rooms) {
		inline.set(r.id, `“${r.name}”`);
		subject.set(r.id, `Room “${r.name}”`);
	}
	for (const p of tree.panels) {
		inline.set(p.id, `“${p.name}”`);
		subject.set(p.id, `Panel “${p.name}”`);
	}
	const panelName = new Map(tree.panels.map((p) => [p.id, p.name]));
	for (const c of tree.circuits) {
		const name = `“${c.label || 'unlabelled'}” (position ${c.position}, panel ${panelName.get(c.panelId) ?? '?'})`;
		inline.set(c.id, name);
		subject.set(c.id, `Circuit ${name}`);
	}
	for (const l of tree.loads) {
		inline.set(l.id, `“${l.description || l.kind}”`);
		subject.set(l.id, `Load “${l.description || l.kind}”`);
	}
	return { inline, subject };
}

/** The engine's reference and structure problems of a job as it is in the database, in people's words. */
async function problemsOf(knex: Knex, jobId: string): Promise<Problem[]> {
	const tree = await loadJobTree(knex, jobId);
	if (!tree) return [];
	const doc = jobDocumentFromRows(tree);
	const names = displayNames(tree);
	return crossCheck(doc).map((text) => {
		const m = /^(rooms|panels|circuits|loads)\[(\d+)\]((?:\.\w+|\[\d+\])*): ([\s\S]*)$/.exec(text);
		const human = (s: string) => s.replace(UUID, (all, id: string) => names.inline.get(id) ?? all);
		if (!m)
			return {
				key: text,
				collection: null,
				entityId: null,
				subject: null,
				field: '',
				message: human(text.replace(/^\w+: /, '')),
			};
		const collection = m[1] as Collection;
		const entityId = (doc[collection][Number(m[2])] as { id: string }).id;
		const field = m[3]!.replace(/\[(\d+)\]/g, '.$1').replace(/^\./, '');
		const message = m[4]!;
		return {
			key: `${collection}#${entityId}${m[3]}: ${message}`,
			collection,
			entityId,
			subject: names.subject.get(entityId) ?? null,
			field,
			message: human(message),
		};
	});
}

/**
 * Keeps a job as consistent as the engine needs it. Call `before` ahead of a write and `check` after
 * it, inside the same transaction: a problem the write introduced (a load at 240 V on a 120 V circuit,
 * a subpanel fed from its own breaker, ...) rolls the write back with a 400 naming the field.
 * `checkAll` does the same for a write of several records: `paths` maps each record's id to the
 * prefix of its fields in the request (`''` for the record itself, `'loads.2.'` for a load of a batch).
 */
export async function consistencyGuard(trx: Knex.Transaction, jobId: string) {
	const before = new Set((await problemsOf(trx, jobId)).map((p) => p.key));
	const checkAll = async (paths: ReadonlyMap<string, string>): Promise<void> => {
		const fresh = (await problemsOf(trx, jobId)).filter((p) => !before.has(p.key));
		if (fresh.length === 0) return;
		const fields: Record<string, string[]> = {};
		for (const p of fresh) {
			const prefix = p.entityId === null ? undefined : paths.get(p.entityId);
			const key = prefix === undefined ? '_' : p.field ? prefix + p.field : prefix.replace(/\.$/, '') || '_';
			const text = prefix !== undefined || p.subject === null ? p.message : `${p.subject}: ${p.message}`;
			(fields[key] ??= []).push(text);
		}
		throw errors.invalid(`This change was not saved: ${fresh[0]!.message}.`, fields);
	};
	return {
		checkAll,
		check: (entityId: string): Promise<void> => checkAll(new Map([[entityId, '']])),
	};
}
