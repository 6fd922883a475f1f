import type { z } from 'zod';
import { jobDocumentSchema } from './schema';
import type { JobDocument } from './schema';
import { circuitVoltage } from './positions';

export type ParseResult = { ok: true; doc: JobDocument } | { ok: false; errors: string[] };

/** Writes a zod issue path the way a person reads it: circuits[3].conductor.size. */
export function formatPath(path: readonly PropertyKey[]): string {
	let out = '';
	for (const part of path) {
		if (typeof part === 'number') out += `[${part}]`;
		else out += (out.length > 0 ? '.' : '') + String(part);
	}
	return out.length > 0 ? out : '(document)';
}

function issueText(issue: z.core.$ZodIssue): string {
	if (issue.code === 'unrecognized_keys') {
		const keys = issue.keys.map((k) => `"${k}"`).join(', ');
		return `${formatPath(issue.path)}: unknown field${issue.keys.length > 1 ? 's' : ''} ${keys}`;
	}
	return `${formatPath(issue.path)}: ${issue.message}`;
}

/**
 * Validates a job document. Structurally impossible input (bad values, unknown references, cycles,
 * a load on a circuit that cannot supply its voltage) is an error; code problems are left to the
 * findings of computeJob.
 */
export function parseJobDocument(input: unknown): ParseResult {
	const parsed = jobDocumentSchema.safeParse(input);
	if (!parsed.success) return { ok: false, errors: parsed.error.issues.map(issueText) };
	const errors = crossCheck(parsed.data);
	return errors.length > 0 ? { ok: false, errors } : { ok: true, doc: parsed.data };
}

function indexUnique<T extends { id: string }>(
	items: readonly T[],
	collection: string,
	errors: string[],
): Map<string, { item: T; index: number }> {
	const map = new Map<string, { item: T; index: number }>();
	items.forEach((item, index) => {
		const seen = map.get(item.id);
		if (seen) {
			errors.push(
				`${collection}[${index}].id: "${item.id}" is already used by ${collection}[${seen.index}]; ids must be unique`,
			);
		} else map.set(item.id, { item, index });
	});
	return map;
}

/** Reference and structure checks that the per-entity schemas cannot make. */
export function crossCheck(doc: JobDocument): string[] {
	const errors: string[] = [];
	const rooms = indexUnique(doc.rooms, 'rooms', errors);
	const panels = indexUnique(doc.panels, 'panels', errors);
	const circuits = indexUnique(doc.circuits, 'circuits', errors);
	indexUnique(doc.loads, 'loads', errors);

	const checkRooms = (ids: readonly string[], at: string) => {
		ids.forEach((roomId, j) => {
			if (!rooms.has(roomId)) errors.push(`${at}.roomIds[${j}]: no room has id "${roomId}"`);
		});
	};

	if (!doc.panels.some((p) => p.kind === 'main')) {
		errors.push("panels: no panel is of kind 'main'; the panel supplied by the service must be listed");
	}

	const fedBy = new Map<string, number>();
	doc.panels.forEach((panel, i) => {
		const at = `panels[${i}]`;
		if (panel.kind === 'main' && panel.fedFromCircuitId !== null) {
			errors.push(
				`${at}.fedFromCircuitId: a main panel is supplied by the service, not by a circuit; use kind 'sub'`,
			);
		}
		if (panel.kind === 'sub') {
			if (panel.fedFromCircuitId === null) {
				errors.push(`${at}.fedFromCircuitId: a subpanel must name the circuit that supplies it`);
				return;
			}
			const feeder = circuits.get(panel.fedFromCircuitId);
			if (!feeder) {
				errors.push(`${at}.fedFromCircuitId: no circuit has id "${panel.fedFromCircuitId}"`);
				return;
			}
			const other = fedBy.get(panel.fedFromCircuitId);
			if (other !== undefined) {
				errors.push(
					`${at}.fedFromCircuitId: circuit "${panel.fedFromCircuitId}" already supplies panels[${other}]; give each subpanel its own feeder breaker`,
				);
			}
			fedBy.set(panel.fedFromCircuitId, i);
			if (feeder.item.status === 'removed') {
				errors.push(
					`${at}.fedFromCircuitId: circuit "${panel.fedFromCircuitId}" is marked removed but supplies this panel`,
				);
			}
			if (feeder.item.poles === 1) {
				errors.push(
					`${at}.fedFromCircuitId: circuit "${panel.fedFromCircuitId}" is 1-pole; a panelboard needs a 2-pole or 3-pole feeder`,
				);
			}
		}
	});

	// Feed cycles: follow each panel up its feeders; a panel reached twice is a loop.
	for (const [panelId, { index }] of panels) {
		const seen = new Set<string>([panelId]);
		let current = panels.get(panelId)?.item;
		while (current && current.kind === 'sub' && current.fedFromCircuitId !== null) {
			const upId = circuits.get(current.fedFromCircuitId)?.item.panelId;
			if (upId === undefined) break;
			if (seen.has(upId)) {
				errors.push(
					`panels[${index}].fedFromCircuitId: the panels feed each other in a loop (${[...seen, upId].join(' → ')})`,
				);
				break;
			}
			seen.add(upId);
			current = panels.get(upId)?.item;
		}
	}

	doc.circuits.forEach((c, i) => {
		const at = `circuits[${i}]`;
		const panel = panels.get(c.panelId)?.item;
		if (!panel) errors.push(`${at}.panelId: no panel has id "${c.panelId}"`);
		else if (c.poles === 3 && panel.voltageSystem === '120/240-1ph-3w') {
			errors.push(
				`${at}.poles: a 3-pole breaker needs a three-phase panelboard; panel "${panel.id}" is 120/240 V single-phase`,
			);
		}
		checkRooms(c.roomIds, at);
		if (c.multiwireWith !== null) {
			if (c.multiwireWith === c.id)
				errors.push(`${at}.multiwireWith: a circuit cannot share a neutral with itself`);
			else if (!circuits.has(c.multiwireWith))
				errors.push(`${at}.multiwireWith: no circuit has id "${c.multiwireWith}"`);
			if (c.poles !== 1) {
				errors.push(
					`${at}.multiwireWith: only 1-pole circuits are paired this way; a ${c.poles}-pole circuit is already one breaker`,
				);
			}
		}
	});

	doc.loads.forEach((load, i) => {
		const at = `loads[${i}]`;
		checkRooms(load.roomIds, at);
		const circuit = circuits.get(load.circuitId)?.item;
		if (!circuit) {
			errors.push(`${at}.circuitId: no circuit has id "${load.circuitId}"`);
			return;
		}
		if (fedBy.has(circuit.id)) {
			errors.push(
				`${at}.circuitId: circuit "${circuit.id}" supplies a subpanel; record the load on one of that panel's circuits`,
			);
		}
		const panel = panels.get(circuit.panelId)?.item;
		if (!panel) return;
		const v = circuitVoltage(circuit.poles, panel.voltageSystem);
		if (v === 120 && load.voltage !== 120) {
			errors.push(
				`${at}.voltage: a ${load.voltage} V load cannot be supplied by ${circuit.poles}-pole circuit "${circuit.id}" at ${v} V`,
			);
		}
	});

	return errors;
}
