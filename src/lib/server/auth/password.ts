import { hash, verify } from '@node-rs/argon2';

// argon2id with the library's defaults (OWASP password storage guidance: argon2id, m ≥ 19 MiB, t ≥ 2).
export const hashPassword = (password: string) => hash(password);

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}
