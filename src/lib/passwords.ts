import bcrypt from 'bcryptjs';

const COST = 11;
// A real hash of a random string: unknown accounts are compared against it so that the answer
// takes as long as for a known account.
const DUMMY_HASH = bcrypt.hashSync('not-a-password-of-anyone', COST);

/** Hashes a password with bcrypt. */
export function hashPassword(password: string): Promise<string> {
	return bcrypt.hash(password, COST);
}

/** Compares a password with a stored hash; with no hash, spends the same time and returns false. */
export async function verifyPassword(password: string, hash: string | null | undefined): Promise<boolean> {
	const ok = await bcrypt.compare(password, hash ?? DUMMY_HASH);
	return ok && !!hash;
}
