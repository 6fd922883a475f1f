import type { Figure, Finding, Line, Severity, Target, Unit } from './types';

/** Rounds to a fixed number of decimals, removing binary noise (0.1 + 0.2 → 0.3). */
export function roundTo(value: number, decimals: number): number {
	const f = 10 ** decimals;
	return Math.round((value + Number.EPSILON * Math.sign(value)) * f) / f;
}

function groupThousands(intPart: string): string {
	if (intPart.length <= 3) return intPart;
	let out = '';
	const first = intPart.length % 3;
	if (first > 0) out = intPart.slice(0, first);
	for (let i = first; i < intPart.length; i += 3) {
		out += (out.length > 0 ? ',' : '') + intPart.slice(i, i + 3);
	}
	return out;
}

/** Formats a number for working text: thousands separators, at most `decimals` decimals, no trailing zeros. */
export function num(value: number, decimals = 2): string {
	const f = decimals === 2 ? 100 : 10 ** decimals;
	const r = Math.round(value * f) / f;
	const neg = r < 0;
	const a = neg ? -r : r;
	let s = String(a);
	if (s.includes('e')) s = a.toFixed(decimals);
	if (a >= 1000) {
		const dot = s.indexOf('.');
		s = groupThousands(dot === -1 ? s : s.slice(0, dot)) + (dot === -1 ? '' : s.slice(dot));
	}
	return neg && r !== 0 ? `-${s}` : s;
}

/** Number with its unit, e.g. '8,000 VA', '125 %'. */
export function q(value: number, unit: Unit, decimals = 2): string {
	if (unit === 'count') return num(value, decimals);
	return `${num(value, decimals)} ${unit === 'ft2' ? 'ft²' : unit}`;
}

/** Text, or a function returning it. */
export type Text = string | (() => string);

/** Builds a figure; `working` may be given as a function returning the text. */
export function fig(value: number, unit: Unit, rule: string, working: Text): Figure {
	return { value, unit, rule, working: typeof working === 'string' ? working : working() };
}

/** Builds a worksheet line. */
export function line(
	key: string,
	label: string,
	value: number,
	unit: Unit,
	rule: string,
	working: string,
): Line {
	return { key, label, value, unit, rule, working };
}

/** Builds a finding. */
export function finding(
	severity: Severity,
	code: string,
	message: Text,
	rule: string,
	target: Target,
): Finding {
	return { severity, code, message: typeof message === 'string' ? message : message(), rule, target };
}
