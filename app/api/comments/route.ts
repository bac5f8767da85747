import { NextResponse } from 'next/server';
import type { CommentOne, CommentThread } from '@/lib/contracts/comments';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { addComment, listThread } from '@/lib/server/services/comments';
import { commentListQuerySchema, commentSchema } from '@/lib/validation/comment';

/** GET /api/comments?subject=observation|vine|task&id= — the thread, oldest first. */
export const GET = memberRoute({ query: commentListQuerySchema, response: responds<CommentThread>() }, async (member, { query }) => ({
  comments: await listThread(member, query.subject, query.id),
}));

/** POST /api/comments `{ subject, subjectId, body }` — "@Name" or "@e-mail" of a member mentions them. */
export const POST = memberRoute({ permission: 'comment', body: commentSchema, response: responds<CommentOne>() }, async (member, { body }) =>
  NextResponse.json({ comment: await addComment(member, body) }, { status: 201 }),
);
