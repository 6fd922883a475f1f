import { fig, q } from './format';
import type { Load } from './schema';
import { section } from './sections';
import { HP_VALUE, motorColumnV, motorFullLoadA } from './tables';
import type { Edition, Figure } from './types';

/** VA of one item of a load: va, watts taken as VA, or Table 430.248 full-load current × voltage. */
export function unitVA(load: Load): number {
	if (load.va !== undefined && load.va !== null) return load.va;
	if (load.watts !== undefined && load.watts !== null) return load.watts;
	if (load.hp !== undefined && load.hp !== null) return motorFullLoadA(load.hp, load.voltage) * load.voltage;
	return 0;
}

/** Whether a load is a motor for 220.50 / 430.22 (given in horsepower, or of kind 'motor'). */
export function isMotor(load: Load): boolean {
	return (load.hp !== undefined && load.hp !== null) || load.kind === 'motor';
}

/** Continuous for sizing: marked so, or by the load's nature (EVSE, Article 625; storage water heater, 422.13 from memory). */
export function isContinuous(load: Load): boolean {
	return load.continuous || load.kind === 'ev-charger' || load.kind === 'water-heater';
}

/** The VA of a load (all items) with its working. */
export function loadVAFigure(load: Load, edition: Edition): Figure {
	const each = unitVA(load);
	const total = each * load.quantity;
	if (load.hp !== undefined && load.hp !== null) {
		const fla = motorFullLoadA(load.hp, load.voltage);
		const col = motorColumnV(load.voltage);
		return fig(
			total,
			'VA',
			section('motorFla', edition),
			`${load.hp} hp at ${col} V column: ${q(fla, 'A')} × ${load.voltage} V = ${q(each, 'VA')}` +
				(load.quantity > 1 ? ` × ${load.quantity} = ${q(total, 'VA')}` : ''),
		);
	}
	const given = load.va !== undefined && load.va !== null ? 'VA' : 'W taken as VA';
	return fig(
		total,
		'VA',
		'rating as given',
		load.quantity > 1
			? `${load.quantity} × ${q(each, 'VA')} = ${q(total, 'VA')} (${given})`
			: `${q(each, 'VA')} (${given})`,
	);
}

/** Motor horsepower as a number, 0 for non-motors. */
export function motorHp(load: Load): number {
	return load.hp !== undefined && load.hp !== null ? HP_VALUE[load.hp] : 0;
}
