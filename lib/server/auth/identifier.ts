/**
 * The address an e-mail link is for, normalised as next-auth 4 does by default
 * (core/routes/signin.js): NFKC, trimmed, lower case, exactly one @, no quotes, and only the part
 * of the domain before a comma. next-auth is given this very function (normalizeIdentifier), so
 * the limit counts the address the link is sent to.
 */
export function normalizeLinkAddress(identifier: string): string {
  const trimmed = identifier.normalize('NFKC').trim();
  if ((trimmed.match(/@/g) ?? []).length !== 1 || trimmed.includes('"')) throw new Error('Invalid email address format.');
  const [local, rawDomain] = trimmed.toLowerCase().split('@');
  const domain = rawDomain?.split(',')[0];
  if (!local || !domain || !domain.includes('.')) throw new Error('Invalid email address format.');
  return `${local}@${domain}`;
}

export function linkIdentifier(email: unknown): string | undefined {
  if (typeof email !== 'string') return undefined;
  try {
    return normalizeLinkAddress(email);
  } catch {
    return undefined;
  }
}
