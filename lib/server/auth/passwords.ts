import 'server-only';
import bcrypt from 'bcryptjs';

// Cost 12 is about 250 ms here: slow for guessing, fine for a person signing in.
const COST = Number(process.env.BCRYPT_COST ?? 12);

export const hashPassword = (password: string) => bcrypt.hash(password, COST);
export const verifyPassword = (password: string, hash: string) => bcrypt.compare(password, hash);
