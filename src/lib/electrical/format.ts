import type { Figure, Finding, Line, Severity, Target, Unit } from './types';

const POWERS_OF_TEN = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8];

/** Rounds to a fixed number of decimals, removing binary noise (0.1 + 0.2 → 0.3). */
export function roundTo(value: number, decimals: number): number {
	const f = POWERS_OF_TEN[decimals] ?? 10 ** decimals;
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

/** Writes a text from one argument: a module-level function, so that no closure is made per figure. */
export type TextOf<T> = (arg: T) => string;

/*
 * Figures and findings built from a function write their text when it is first read: a large job
 * has hundreds of thousands of them and most texts are never shown. The text is a getter on the
 * class, and toJSON gives the plain object, fields in the same order, so JSON (the API, the CLI)
 * is the same as for a plain object. Spread, Object.keys and structured clone do not see the text:
 * hand results across threads as the document and compute them again there. Texts must only use
 * values fixed when they are built.
 */

/** A text written when first read: a string, or a function of one argument called once. */
class LazyText {
	#text: string | TextOf<unknown>;
	#arg: unknown;
	constructor(text: string | TextOf<unknown>, arg: unknown) {
		this.#text = text;
		this.#arg = arg;
	}
	protected text(): string {
		const t = this.#text;
		if (typeof t === 'string') return t;
		const s = t(this.#arg);
		this.#text = s;
		this.#arg = undefined;
		return s;
	}
}

class LazyFigure extends LazyText implements Figure {
	value: number;
	unit: Unit;
	rule: string;
	constructor(value: number, unit: Unit, rule: string, text: string | TextOf<unknown>, arg: unknown) {
		super(text, arg);
		this.value = value;
		this.unit = unit;
		this.rule = rule;
	}
	get working(): string {
		return this.text();
	}
	toJSON(): Figure {
		return { value: this.value, unit: this.unit, rule: this.rule, working: this.working };
	}
}

class LazyFinding extends LazyText implements Finding {
	severity: Severity;
	code: string;
	rule: string;
	target: Target;
	constructor(
		severity: Severity,
		code: string,
		text: string | TextOf<unknown>,
		arg: unknown,
		rule: string,
		target: Target,
	) {
		super(text, arg);
		this.severity = severity;
		this.code = code;
		this.rule = rule;
		this.target = target;
	}
	get message(): string {
		return this.text();
	}
	toJSON(): Finding {
		return {
			severity: this.severity,
			code: this.code,
			message: this.message,
			rule: this.rule,
			target: this.target,
		};
	}
}

/** Builds a figure; `working` may be a function returning the text, called when the text is first read. */
export function fig(value: number, unit: Unit, rule: string, working: Text): Figure {
	if (typeof working === 'string') return { value, unit, rule, working };
	return new LazyFigure(value, unit, rule, working, undefined);
}

/** Builds a figure whose working `text(arg)` writes when first read. */
export function figOf<T>(value: number, unit: Unit, rule: string, text: TextOf<T>, arg: T): Figure {
	return new LazyFigure(value, unit, rule, text as TextOf<unknown>, arg);
}

class LazyLine extends LazyFigure implements Line {
	key: string;
	label: string;
	constructor(key: string, label: string, value: number, unit: Unit, rule: string, text: TextOf<unknown>) {
		super(value, unit, rule, text, undefined);
		this.key = key;
		this.label = label;
	}
	toJSON(): Line {
		return {
			key: this.key,
			label: this.label,
			value: this.value,
			unit: this.unit,
			rule: this.rule,
			working: this.working,
		};
	}
}

/** Builds a worksheet line; `working` may be a function returning the text, called when the text is first read. */
export function line(
	key: string,
	label: string,
	value: number,
	unit: Unit,
	rule: string,
	working: Text,
): Line {
	if (typeof working === 'string') return { key, label, value, unit, rule, working };
	return new LazyLine(key, label, value, unit, rule, working);
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
	return new LazyFinding(severity, code, message, undefined, rule, target);
}

/** Builds a finding whose message `text(arg)` writes when first read. */
export function findingOf<T>(
	severity: Severity,
	code: string,
	text: TextOf<T>,
	arg: T,
	rule: string,
	target: Target,
): Finding {
	return new LazyFinding(severity, code, text as TextOf<unknown>, arg, rule, target);
}
