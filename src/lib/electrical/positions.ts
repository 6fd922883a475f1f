/**
 * Panel position scheme: positions 1..spaces, odd on the left and even on the right; positions 1
 * and 2 form row 1, 3 and 4 row 2, and so on. On 120/240 V single-phase the legs alternate by row
 * (row 1 leg A, row 2 leg B, ...); on 208Y/120 V three-phase the phases A, B, C rotate by row.
 * A multi-pole breaker at position p takes p, p + 2 (and p + 4): the same column, adjacent rows.
 */
import type { VoltageSystem } from './schema';
import type { Leg } from './types';

/** Row of a position (1-based). */
export function rowOf(position: number): number {
	return Math.ceil(position / 2);
}

/** Column side of a position. */
export function sideOf(position: number): 'left' | 'right' {
	return position % 2 === 1 ? 'left' : 'right';
}

/** Leg (phase) a position connects to. */
export function legOf(position: number, system: VoltageSystem): Leg {
	const row = rowOf(position);
	if (system === '120/240-1ph-3w') return row % 2 === 1 ? 'A' : 'B';
	return (['A', 'B', 'C'] as const)[(row - 1) % 3] ?? 'A';
}

/** Legs of a panel's voltage system. */
export function legsOf(system: VoltageSystem): Leg[] {
	return system === '120/240-1ph-3w' ? ['A', 'B'] : ['A', 'B', 'C'];
}

/** Positions a breaker takes. */
export function positionsTaken(position: number, poles: 1 | 2 | 3): number[] {
	if (poles === 1) return [position];
	if (poles === 2) return [position, position + 2];
	return [position, position + 2, position + 4];
}

/** Nominal voltage of a circuit: 120 V line to neutral, 240 V or 208 V line to line. */
export function circuitVoltage(poles: 1 | 2 | 3, system: VoltageSystem): 120 | 208 | 240 {
	if (poles === 1) return 120;
	return system === '120/240-1ph-3w' ? 240 : 208;
}

/** Divisor turning VA into line amperes: V, or V × √3 for a three-phase circuit. */
export function ampsDivisor(poles: 1 | 2 | 3, system: VoltageSystem): number {
	const v = circuitVoltage(poles, system);
	return poles === 3 ? v * Math.sqrt(3) : v;
}
