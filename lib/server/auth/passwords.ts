import 'server-only';
import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { envSetting } from '@/lib/env';

const COST = envSetting('BCRYPT_COST');

export const hashPassword = (password: string) => bcrypt.hash(password, COST);
export const verifyPassword = (password: string, hash: string) => bcrypt.compare(password, hash);

let dummy: Promise<string> | undefined;
/** A hash of a secret nobody knows, at the cost of real ones: unknown addresses are checked against it. */
export const dummyHash = () => (dummy ??= bcrypt.hash(randomBytes(24).toString('base64'), COST));
