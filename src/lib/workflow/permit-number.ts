import type { Knex } from 'knex';

/**
 * Fills a permit number pattern: {YYYY} becomes the year, {SEQ:n} the running number padded to n
 * digits (a longer number is printed whole rather than cut). The pattern was checked by
 * permitPatternSchema when the jurisdiction saved it.
 */
export function formatPermitNumber(pattern: string, year: number, seq: number): string {
	return pattern
		.replace(/\{YYYY\}/g, String(year).padStart(4, '0'))
		.replace(/\{SEQ:([1-9])\}/g, (_, n: string) => String(seq).padStart(Number(n), '0'));
}

/** The counter a pattern runs on: per year when the number shows the year, else one counter for all time. */
export function permitPeriod(pattern: string, year: number): string {
	return pattern.includes('{YYYY}') ? String(year) : '';
}

/**
 * Takes the jurisdiction's next permit number inside the caller's transaction. The counter row is
 * bumped with one upsert, so concurrent approvals wait on the row lock and each gets its own number;
 * a rolled-back approval gives its number back.
 */
export async function issuePermitNumber(
	trx: Knex.Transaction,
	jurisdictionId: string,
	date: Date,
): Promise<string> {
	const row = await trx('jurisdictions').where({ id: jurisdictionId }).first('permit_number_pattern');
	if (!row) throw new Error(`jurisdiction ${jurisdictionId} is missing`);
	const pattern = String(row.permit_number_pattern);
	const year = date.getUTCFullYear();
	const { rows } = await trx.raw<{ rows: { last: number }[] }>(
		`INSERT INTO permit_counters (jurisdiction_id, period, last) VALUES (?, ?, 1)
		 ON CONFLICT (jurisdiction_id, period) DO UPDATE SET last = permit_counters.last + 1
		 RETURNING last`,
		[jurisdictionId, permitPeriod(pattern, year)],
	);
	return formatPermitNumber(pattern, year, rows[0]!.last);
}
