import type { Knex } from 'knex';
import { findUserByEmail } from './repositories/accounts';
import { verifyPassword } from './passwords';

/** Failed attempts within the window after which sign-in is refused for a while. */
export const THROTTLE = { windowMinutes: 15, perAccount: 5, perAddress: 40 } as const;

export type SignInOutcome =
	| { ok: true; user: { id: string; email: string; name: string } }
	| { ok: false; reason: 'invalid' | 'throttled' };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Checks an e-mail and password. Repeated failures for one account or from one address are slowed
 * down and then refused for the rest of the window. Unknown accounts and wrong passwords look alike.
 */
export async function checkCredentials(
	knex: Knex,
	email: string,
	password: string,
	ip: string,
): Promise<SignInOutcome> {
	const since = knex.raw(`now() - interval '${THROTTLE.windowMinutes} minutes'`);
	const failuresSince = async (column: 'email' | 'ip', value: string): Promise<number> => {
		const row = await knex('sign_in_attempts')
			.where({ [column]: value, succeeded: false })
			.andWhere('created_at', '>', since)
			.count<{ count: string }>('* as count')
			.first();
		return Number(row?.count ?? 0);
	};
	const [accountFailures, addressFailures] = await Promise.all([
		failuresSince('email', email),
		failuresSince('ip', ip),
	]);
	if (accountFailures >= THROTTLE.perAccount || addressFailures >= THROTTLE.perAddress) {
		return { ok: false, reason: 'throttled' };
	}
	// Each earlier failure adds a little wait before the answer.
	if (accountFailures > 0) await sleep(Math.min(250 * accountFailures, 1500));

	const user = await findUserByEmail(knex, email);
	const valid = await verifyPassword(password, user?.password_hash);
	await knex('sign_in_attempts').insert({ email, ip, succeeded: valid });
	if (!valid || !user) return { ok: false, reason: 'invalid' };
	return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}
