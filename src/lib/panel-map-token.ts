import { createCipheriv, createDecipheriv, createHash, randomBytes } from 'node:crypto';

/** A new random link token: 24 random bytes, base64url (32 characters). */
export function newMapToken(): string {
	return randomBytes(24).toString('base64url');
}

/** The SHA-256 of a token, hex: what the database looks tokens up by. */
export function hashMapToken(token: string): string {
	return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** Whether a string could be a token at all (so junk never reaches the database). */
export function looksLikeMapToken(token: string): boolean {
	return /^[A-Za-z0-9_-]{32}$/.test(token);
}

function key(): Buffer {
	const secret = process.env.AUTH_SECRET;
	if (!secret) throw new Error('AUTH_SECRET is not set: panel map links cannot be sealed');
	return createHash('sha256').update(`ampledger panel map link\u0000${secret}`).digest();
}

/** Seals a token with the app's secret (AES-256-GCM) so the link can be shown again. */
export function sealMapToken(token: string): string {
	const iv = randomBytes(12);
	const cipher = createCipheriv('aes-256-gcm', key(), iv);
	const body = Buffer.concat([cipher.update(token, 'utf8'), cipher.final()]);
	return [iv, cipher.getAuthTag(), body].map((b) => b.toString('base64url')).join('.');
}

/** The token inside a sealed value, or null when the secret changed or the value was altered. */
export function unsealMapToken(sealed: string): string | null {
	try {
		const [iv, tag, body] = sealed.split('.').map((p) => Buffer.from(p, 'base64url'));
		if (!iv || !tag || !body) return null;
		const decipher = createDecipheriv('aes-256-gcm', key(), iv);
		decipher.setAuthTag(tag);
		return Buffer.concat([decipher.update(body), decipher.final()]).toString('utf8');
	} catch {
		return null;
	}
}

/** The public address of a panel map: PUBLIC_BASE_URL when set, else the request's origin. */
export function mapLink(token: string, requestOrigin: string): string {
	const base = (process.env.PUBLIC_BASE_URL || requestOrigin).replace(/\/+$/, '');
	return `${base}/map/${token}`;
}
