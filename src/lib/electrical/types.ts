/** Units a figure can carry. */
export type Unit = 'VA' | 'W' | 'kW' | 'A' | '%' | 'V' | 'ft' | 'ft2' | 'in' | 'count' | 'ohm';

/** A number with its reason: the rule it comes from and the arithmetic that produced it. */
export interface Figure {
	value: number;
	unit: Unit;
	/** Code edition and section, e.g. 'NEC 2023 220.55, Table 220.55 Column C'. */
	rule: string;
	/** The arithmetic as text, e.g. '12 kW ≤ 12 kW → 8,000 VA'. */
	working: string;
}

/** A figure that is one line of a worksheet. */
export interface Line extends Figure {
	/** Stable key of the line, e.g. 'general-lighting'. */
	key: string;
	label: string;
}

export type Severity = 'ok' | 'note' | 'warning' | 'violation';

export interface Target {
	kind: 'job' | 'panel' | 'circuit' | 'room' | 'load';
	id: string;
}

/** The outcome of one check. */
export interface Finding {
	severity: Severity;
	/** Stable identifier of the check, e.g. 'breaker-overload'. */
	code: string;
	message: string;
	rule: string;
	target: Target;
}

export type Edition = '2017' | '2020' | '2023';
export type Leg = 'A' | 'B' | 'C';
