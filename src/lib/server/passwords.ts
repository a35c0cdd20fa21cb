/** Password hashing with bcrypt (bcryptjs: pure JS, no native build on the target machine). */
import bcrypt from 'bcryptjs';

/** Cost 12: ≈ 0.3 s per hash here, slow for guessing, fine for an interactive sign-in. */
const COST = 12;

export function hashPassword(plain: string): Promise<string> {
	return bcrypt.hash(plain, COST);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
	return bcrypt.compare(plain, hash);
}
