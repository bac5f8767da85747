import 'server-only';
import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';

// Cost 12 is about 250 ms here: slow for guessing, fine for a person signing in.
const COST = Number(process.env.BCRYPT_COST ?? 12);

export const hashPassword = (password: string) => bcrypt.hash(password, COST);
export const verifyPassword = (password: string, hash: string) => bcrypt.compare(password, hash);

let dummy: Promise<string> | undefined;
/** A hash of a secret nobody knows, at the cost of real ones: unknown addresses are checked against it. */
export const dummyHash = () => (dummy ??= bcrypt.hash(randomBytes(24).toString('base64'), COST));
