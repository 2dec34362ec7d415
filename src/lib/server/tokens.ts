import { createHash, randomBytes } from 'node:crypto';

/** A random URL-safe token with 256 bits of entropy, for links sent by e-mail. */
export function generateToken(): string {
	return randomBytes(32).toString('base64url');
}

/** Tokens and session ids are stored only as this hash. */
export function sha256Hex(value: string): string {
	return createHash('sha256').update(value).digest('hex');
}
