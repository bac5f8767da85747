/**
 * A comment: plain text (links allowed, no markup) on an observation, a vine or a task. Mentions are
 * written "@Full Name" or "@e-mail" and found by the server among the organisation's members.
 */
import { z } from 'zod';

export const COMMENT_SUBJECTS = ['observation', 'vine', 'task'] as const;
export type CommentSubject = (typeof COMMENT_SUBJECTS)[number];

export const COMMENT_MAX_LENGTH = 4000;

export const commentSchema = z.strictObject({
  subject: z.enum(COMMENT_SUBJECTS, 'Must be observation, vine or task'),
  subjectId: z.uuid('Must be the id of what you comment on'),
  body: z
    .string('Write a comment')
    .trim()
    .min(1, 'Write a comment')
    .max(COMMENT_MAX_LENGTH, `Comments are limited to ${COMMENT_MAX_LENGTH.toLocaleString('en')} characters`),
});
export type CommentInput = z.infer<typeof commentSchema>;

export const commentListQuerySchema = z.strictObject({
  subject: z.enum(COMMENT_SUBJECTS, 'Must be observation, vine or task'),
  id: z.uuid('Must be the id of what was commented on'),
});

const WORD = /[\p{L}\p{N}_]/u;

/**
 * The members a comment mentions: "@" followed by a member's full name or e-mail, not glued to a
 * word before it or a letter after it. The longest name wins, so "@Ana Lu" is not also "@Ana";
 * members who share a name are all mentioned by it, as nothing tells them apart.
 */
export function findMentions(body: string, members: { userId: string; name: string | null; email: string }[]): string[] {
  const text = body.toLowerCase();
  const handles = members
    .flatMap((m) => [m.name, m.email].filter((h): h is string => !!h && h.trim().length > 0).map((h) => ({ userId: m.userId, handle: h.trim().toLowerCase() })))
    .sort((a, b) => b.handle.length - a.handle.length);
  const taken: { start: number; end: number; handle: string }[] = [];
  const found = new Set<string>();
  for (const { userId, handle } of handles) {
    for (let at = text.indexOf(`@${handle}`); at !== -1; at = text.indexOf(`@${handle}`, at + 1)) {
      const end = at + handle.length + 1;
      if ((at > 0 && WORD.test(text[at - 1]!)) || (end < text.length && WORD.test(text[end]!))) continue;
      if (taken.some((t) => t.handle !== handle && at < t.end && end > t.start)) continue;
      taken.push({ start: at, end, handle });
      found.add(userId);
    }
  }
  return [...found];
}
