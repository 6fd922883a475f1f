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
	// Whole numbers (most figures) skip the rounding; the text is the same as below.
	if (Number.isInteger(value) && value < 1e12 && value > -1e12) {
		if (value === 0) return '0';
		const neg = value < 0;
		let s = String(neg ? -value : value);
		if (s.length > 3) s = groupThousands(s);
		return neg ? `-${s}` : s;
	}
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

/*
 * Figures and findings built from a function write their text when it is first read: a large job
 * has hundreds of thousands of them and most texts are never shown. The text is an own enumerable
 * accessor, so JSON, spread, structured clone (the documents worker) and Object.keys see the same
 * fields, in the same order, as a plain object. Texts must only use values fixed when they are built.
 */

class LazyFigure implements Figure {
	declare value: number;
	declare unit: Unit;
	declare rule: string;
	declare working: string;
	#text: Text;
	constructor(value: number, unit: Unit, rule: string, text: Text) {
		this.#text = text;
		this.value = value;
		this.unit = unit;
		this.rule = rule;
		Object.defineProperty(this, 'working', WORKING);
	}
	static read(f: LazyFigure): string {
		const t = f.#text;
		if (typeof t === 'string') return t;
		const s = t();
		f.#text = s;
		return s;
	}
	static write(f: LazyFigure, s: string): void {
		f.#text = s;
	}
}
const WORKING: PropertyDescriptor = {
	get(this: LazyFigure) {
		return LazyFigure.read(this);
	},
	set(this: LazyFigure, s: string) {
		LazyFigure.write(this, s);
	},
	enumerable: true,
	configurable: true,
};

class LazyFinding implements Finding {
	declare severity: Severity;
	declare code: string;
	declare message: string;
	declare rule: string;
	declare target: Target;
	#text: Text;
	constructor(severity: Severity, code: string, text: Text, rule: string, target: Target) {
		this.#text = text;
		this.severity = severity;
		this.code = code;
		Object.defineProperty(this, 'message', MESSAGE);
		this.rule = rule;
		this.target = target;
	}
	static read(f: LazyFinding): string {
		const t = f.#text;
		if (typeof t === 'string') return t;
		const s = t();
		f.#text = s;
		return s;
	}
	static write(f: LazyFinding, s: string): void {
		f.#text = s;
	}
}
const MESSAGE: PropertyDescriptor = {
	get(this: LazyFinding) {
		return LazyFinding.read(this);
	},
	set(this: LazyFinding, s: string) {
		LazyFinding.write(this, s);
	},
	enumerable: true,
	configurable: true,
};

/** Builds a figure; `working` may be a function returning the text, called when the text is first read. */
export function fig(value: number, unit: Unit, rule: string, working: Text): Figure {
	if (typeof working === 'string') return { value, unit, rule, working };
	return new LazyFigure(value, unit, rule, working);
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

/** Builds a finding; `message` may be a function returning the text, called when the text is first read. */
export function finding(
	severity: Severity,
	code: string,
	message: Text,
	rule: string,
	target: Target,
): Finding {
	if (typeof message === 'string') return { severity, code, message, rule, target };
	return new LazyFinding(severity, code, message, rule, target);
}
