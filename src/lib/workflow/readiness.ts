/**
 * The readiness check run before a submission: what the engine still finds wrong with the live
 * job (each error-level finding fixed or explained), the documents the jurisdiction asks for, and
 * the jurisdiction itself. The check helps prepare a complete packet; the plan reviewer decides.
 */
import type { Knex } from 'knex';
import type { Finding, JobResult, Target } from '../electrical';
import { engineOutcome, jobDocumentFromRows, type JobTree } from '../job-document';
import type { JobDocument } from '../electrical/schema';
import { requiredDocumentsSchema, type RequiredDocuments } from '../schemas/jurisdiction';
import { allowedTransitions, JOB_STATUS_LABELS, type JobStatus, type WorkflowAction } from './status';

export type ReadinessCode =
	'status' | 'jurisdiction' | 'engine' | 'panel-schedule' | 'load-calculation' | 'sketch' | 'violation';

/** One line of the check: met or not, in words, and what it is about. */
export interface ReadinessItem {
	code: ReadinessCode;
	ok: boolean;
	message: string;
	target?: Target;
	/** For a violation: the key an explanation names, and the rule the finding cites. */
	findingKey?: string;
	rule?: string;
}

export interface Readiness {
	items: ReadinessItem[];
	/** The move a submission makes now ('submit' from a draft or withdrawn job, 'resubmit' after corrections), or null. */
	action: Extract<WorkflowAction, 'submit' | 'resubmit'> | null;
	/** Every item is met, or is a violation that a note may explain. */
	canSubmit: boolean;
}

/** The key an explanation uses for a finding: code and target, with `#2`, `#3` for repeats on one target. */
export function findingKeys(findings: readonly Finding[]): string[] {
	const seen = new Map<string, number>();
	return findings.map((f) => {
		const base = `${f.code}:${f.target.kind}:${f.target.id}`;
		const n = (seen.get(base) ?? 0) + 1;
		seen.set(base, n);
		return n === 1 ? base : `${base}#${n}`;
	});
}

/** The error-level findings of a result, each with its key. */
export function violationsOf(result: JobResult): { key: string; finding: Finding }[] {
	const list = result.findings.filter((f) => f.severity === 'violation');
	const keys = findingKeys(list);
	return list.map((finding, i) => ({ key: keys[i]!, finding }));
}

/**
 * Whether the job changes the service or a feeder, so that a load calculation belongs in the
 * packet: a new or modified circuit feeding a subpanel (a feeder), or any new or modified circuit
 * with loads on a main panel (it adds to the service load).
 */
export function changesServiceOrFeeder(doc: JobDocument): { needed: boolean; why: string } {
	const changed = new Set(
		doc.circuits.filter((c) => c.status === 'new' || c.status === 'modified').map((c) => c.id),
	);
	const feeder = doc.panels.find(
		(p) => p.kind === 'sub' && p.fedFromCircuitId && changed.has(p.fedFromCircuitId),
	);
	if (feeder) return { needed: true, why: `the feeder to ${feeder.name} is new or modified` };
	const mains = new Set(doc.panels.filter((p) => p.kind === 'main').map((p) => p.id));
	const loaded = new Set(doc.loads.map((l) => l.circuitId));
	const added = doc.circuits.find((c) => changed.has(c.id) && mains.has(c.panelId) && loaded.has(c.id));
	if (added)
		return {
			needed: true,
			why: `a new or modified circuit (${added.label || 'no label'}) adds load to the service`,
		};
	return { needed: false, why: 'no new or modified feeder or service load' };
}

const SUBMIT_ACTIONS = ['submit', 'resubmit'] as const;

/** The submission move open from a status, or null. */
export function submissionAction(status: JobStatus): Readiness['action'] {
	const t = allowedTransitions(status, 'contractor').find((m) =>
		(SUBMIT_ACTIONS as readonly string[]).includes(m.action),
	);
	return (t?.action as Readiness['action']) ?? null;
}

/**
 * The check itself, from the job's rows, the jurisdiction's required documents (null when the job
 * has no jurisdiction) and the number of sketches. Pure: the caller loads what it needs.
 */
export function checkReadiness(
	tree: JobTree,
	required: RequiredDocuments | null,
	sketchCount: number,
): Readiness & {
	doc: JobDocument | null;
	result: JobResult | null;
	violations: { key: string; finding: Finding }[];
} {
	const items: ReadinessItem[] = [];
	const { job } = tree;
	const action = submissionAction(job.status);
	items.push({
		code: 'status',
		ok: action !== null,
		message:
			action === 'resubmit'
				? 'Corrections were requested: this submission is the next revision.'
				: action === 'submit'
					? `The job is “${JOB_STATUS_LABELS[job.status]}” and can be submitted for plan review.`
					: `A job that is “${JOB_STATUS_LABELS[job.status]}” is not submitted again now.`,
	});
	items.push({
		code: 'jurisdiction',
		ok: job.jurisdictionId !== null,
		message: job.jurisdictionName
			? `Filed with ${job.jurisdictionName}.`
			: 'Choose the jurisdiction (AHJ) in the job details: it receives the submission.',
	});

	const doc = jobDocumentFromRows(tree);
	const outcome = engineOutcome(doc);
	if (!outcome.ok) {
		items.push({
			code: 'engine',
			ok: false,
			message: `The checks cannot run yet: ${outcome.errors.slice(0, 3).join('; ')}${outcome.errors.length > 3 ? ` (and ${outcome.errors.length - 3} more)` : ''}.`,
		});
		return { items, action, canSubmit: false, doc: null, result: null, violations: [] };
	}
	const result = outcome.results;
	const docs = required ?? requiredDocumentsSchema.parse({});

	const circuitsPer = new Map<string, number>();
	for (const c of doc.circuits) circuitsPer.set(c.panelId, (circuitsPer.get(c.panelId) ?? 0) + 1);
	if (docs.panelSchedules) {
		for (const p of doc.panels) {
			const count = circuitsPer.get(p.id) ?? 0;
			items.push({
				code: 'panel-schedule',
				ok: count > 0,
				target: { kind: 'panel', id: p.id },
				message:
					count > 0
						? `Panel schedule for ${p.name}: ${count} circuit${count === 1 ? '' : 's'}.`
						: `Panel schedule for ${p.name}: the panel has no circuits yet; add its circuits or remove the panel.`,
			});
		}
	}
	if (docs.loadCalculation) {
		const change = changesServiceOrFeeder(doc);
		const computed = result.service.lowestMethod !== null;
		items.push({
			code: 'load-calculation',
			ok: !change.needed || computed,
			message: !change.needed
				? `Load calculation: not required by this job (${change.why}); the worksheet is in the packet anyway.`
				: computed
					? `Load calculation: required because ${change.why}; the service worksheet (Article 220) is in the packet.`
					: `Load calculation: required because ${change.why}, but no service method applies to the records yet; complete the loads.`,
		});
	}
	if (docs.sketch) {
		items.push({
			code: 'sketch',
			ok: sketchCount > 0,
			message:
				sketchCount > 0
					? `Sketches: ${sketchCount} in the packet.`
					: 'Sketches: the jurisdiction asks for at least one floor-plan sketch; upload one in the Sketches section.',
		});
	}

	const violations = violationsOf(result);
	for (const v of violations) {
		items.push({
			code: 'violation',
			ok: false,
			message: v.finding.message,
			rule: v.finding.rule,
			target: { kind: v.finding.target.kind, id: v.finding.target.id },
			findingKey: v.key,
		});
	}
	const canSubmit = items.every((i) => i.ok || i.code === 'violation');
	return { items, action, canSubmit, doc, result, violations };
}

/** The readiness of a job from the database: its tree, its jurisdiction's required documents, its sketches. */
export async function loadReadiness(knex: Knex, tree: JobTree): Promise<ReturnType<typeof checkReadiness>> {
	const [jurisdiction, sketches] = await Promise.all([
		tree.job.jurisdictionId
			? knex('jurisdictions').where({ id: tree.job.jurisdictionId }).first('required_documents')
			: Promise.resolve(null),
		knex('sketches').where({ job_id: tree.job.id }).count({ n: '*' }),
	]);
	// A stored setting the schema no longer reads falls back to the defaults rather than blocking a submission.
	const parsed = jurisdiction
		? requiredDocumentsSchema.safeParse(jurisdiction.required_documents ?? {})
		: null;
	const required = parsed ? (parsed.success ? parsed.data : requiredDocumentsSchema.parse({})) : null;
	return checkReadiness(tree, required, Number((sketches as { n: string }[])[0]?.n ?? 0));
}
