/** A plain-text report of a job result, with the working of every figure. */
import type { CircuitResult } from './circuit-checks';
import type { JobResult, MethodResult } from './compute-job';
import { num, q } from './format';
import type { Figure, Finding, Line } from './types';

const MARK: Record<Finding['severity'], string> = {
	ok: 'ok  ',
	note: 'note',
	warning: 'WARN',
	violation: 'FAIL',
};

function figureLine(label: string, f: Figure): string {
	return `  ${label}: ${q(f.value, f.unit)}\n      ${f.working}  [${f.rule}]`;
}

function worksheet(lines: readonly Line[]): string[] {
	return lines.map(
		(l) => `    ${l.label.padEnd(52)} ${q(l.value, l.unit).padStart(14)}\n        ${l.working}  [${l.rule}]`,
	);
}

function method(m: MethodResult): string[] {
	const out = [`  ${m.title} (${m.rule})`];
	if (!m.applicable) {
		out.push(`    not applicable: ${m.reason}`);
		return out;
	}
	out.push(...worksheet(m.lines));
	if (m.amps && m.ampsRounded && m.minimumServiceA && m.headroomA) {
		out.push(`    Amperes: ${m.amps.working}; ${m.ampsRounded.working}  [${m.ampsRounded.rule}]`);
		out.push(`    Minimum service: ${m.minimumServiceA.working}  [${m.minimumServiceA.rule}]`);
		out.push(`    Headroom on the service: ${m.headroomA.working}`);
	}
	return out;
}

function circuitBlock(c: CircuitResult): string[] {
	const out = [
		`Circuit ${c.positions.join('/')} (${c.legs.join('')}) “${c.label}” [${c.circuitId}, ${c.status}]${c.feedsPanelId ? ` feeds panel ${c.feedsPanelId}` : ''}`,
	];
	out.push(figureLine('Connected load', c.connectedVA));
	out.push(figureLine('Current', c.amps));
	out.push(figureLine('Load on the breaker', c.breakerLoadA));
	if (c.conductorLoadA.value !== c.breakerLoadA.value)
		out.push(figureLine('Load on the conductors', c.conductorLoadA));
	out.push(figureLine('Breaker', c.breakerA));
	if (c.conductorAmpacityA) out.push(figureLine('Conductor ampacity', c.conductorAmpacityA));
	if (c.smallConductorLimitA) out.push(figureLine('Small-conductor limit', c.smallConductorLimitA));
	out.push(figureLine('Voltage drop', c.voltageDrop.percent));
	if (c.voltageDropTotal) out.push(figureLine('Voltage drop with feeders', c.voltageDropTotal));
	for (const f of c.findings)
		if (f.severity !== 'ok') out.push(`  ${MARK[f.severity]} ${f.message}  [${f.rule}]`);
	return out;
}

/** Renders a job result as a readable report. */
export function formatJobReport(r: JobResult): string {
	const out: string[] = [];
	out.push(`JOB: ${r.job.name}${r.job.address ? `, ${r.job.address}` : ''}`);
	out.push(`Code: NEC ${r.job.codeEdition}; terminals ${r.job.terminalTemperatureC} °C`);
	out.push(
		`Findings: ${r.summary.violation} violation(s), ${r.summary.warning} warning(s), ${r.summary.note} note(s), ${r.summary.ok} check(s) passed`,
	);
	out.push('', '== SERVICE ==');
	const s = r.service;
	out.push(`Service: ${s.ratingA} A, ${s.voltageSystem}`);
	out.push(figureLine('Floor area', s.floorArea));
	for (const m of s.methods) out.push('', ...method(m));
	out.push('', '  Neutral (220.61)');
	out.push(...worksheet(s.neutral.lines));
	out.push(`    Amperes: ${s.neutral.amps.working}; ${s.neutral.ampsRounded.working}`);
	out.push('');
	out.push(
		`  Lowest applicable method: ${s.lowestMethod ?? 'none'}; minimum service ${q(s.minimumServiceA.value, 'A', 0)}`,
	);
	for (const f of s.findings) out.push(`  ${MARK[f.severity]} ${f.message}  [${f.rule}]`);

	for (const p of r.panels) {
		out.push(
			'',
			`== PANEL ${p.name} (${p.kind}, ${p.voltageSystem}, ${p.busRatingA} A bus, ${p.mainBreakerA === null ? 'main-lug' : `${p.mainBreakerA} A main`}) ==`,
		);
		out.push(
			`  Positions: ${p.used} used, ${p.free} free of ${p.spaces}${p.free > 0 ? ` (free: ${p.freePositions.join(', ')})` : ''}`,
		);
		const rows: string[] = [];
		for (let i = 0; i < p.positions.length; i += 2) {
			const left = p.positions[i];
			const right = p.positions[i + 1];
			const cell = (slot: typeof left) =>
				slot ? `${String(slot.position).padStart(2)} ${slot.leg} ${(slot.circuitId ?? '—').padEnd(16)}` : '';
			rows.push(`    ${cell(left)} | ${cell(right)}`);
		}
		out.push(...rows);
		for (const l of p.legs) out.push(`  Leg ${l.leg}: ${q(l.amps.value, 'A')} (${q(l.va.value, 'VA')})`);
		out.push(figureLine('Imbalance', p.imbalance));
		out.push(figureLine('Connected load', p.connectedVA));
		out.push(figureLine('Calculated load', p.calculatedVA));
		out.push(figureLine('Calculated current', p.calculatedA));
		for (const f of p.findings)
			if (f.severity !== 'ok') out.push(`  ${MARK[f.severity]} ${f.message}  [${f.rule}]`);
	}

	out.push('', '== CIRCUITS ==');
	for (const c of r.circuits) out.push(...circuitBlock(c), '');

	out.push('== PROTECTION AND REQUIRED CIRCUITS ==');
	for (const f of r.protection) out.push(`  ${MARK[f.severity]} ${f.message}  [${f.rule}]`);
	out.push(
		'',
		`(${num(r.findings.length, 0)} findings in all. The checks help prepare documents; they do not certify a design. Local amendments and the AHJ govern.)`,
	);
	return out.join('\n');
}
