'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { LinkedText } from '@/components/comments/linked-text';
import { memberLabel, useCrew } from '@/components/tasks/use-crew';
import { Button } from '@/components/ui/button';
import { Notice, Select } from '@/components/ui/field';
import { apiGet, apiSend, ApiError } from '@/lib/api-client';
import type { CommentThread as Thread } from '@/lib/contracts/comments';
import { COMMENT_MAX_LENGTH, type CommentSubject } from '@/lib/validation/comment';

const when = (iso: string) =>
  new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone: 'UTC' }) + ' UTC';

const postComment = (input: { subject: CommentSubject; subjectId: string; body: string }) => apiSend('POST', '/api/comments', input);

/**
 * A thread on a finding, a vine or a task: plain text, links made clickable, "@Name" mentions
 * (the picker writes them) that mail the person. A refused comment stays in the box.
 */
export function CommentThread({ subject, subjectId, label = 'Comments' }: { subject: CommentSubject; subjectId: string; label?: string }) {
  const queryClient = useQueryClient();
  const key = ['comments', subject, subjectId];
  const thread = useQuery({
    queryKey: key,
    queryFn: ({ signal }) => apiGet<Thread>(`/api/comments?subject=${subject}&id=${subjectId}`, { signal }),
  });
  const crew = useCrew();
  const [body, setBody] = useState('');
  const box = useRef<HTMLTextAreaElement>(null);
  const send = useMutation({
    mutationFn: postComment,
    onSuccess: async () => {
      setBody('');
      await queryClient.invalidateQueries({ queryKey: key });
    },
  });
  const id = `comment-${subject}-${subjectId}`;

  function mention(userId: string) {
    const person = crew.data?.find((m) => m.userId === userId);
    if (!person) return;
    const handle = `@${memberLabel(person)} `;
    const at = box.current?.selectionStart ?? body.length;
    setBody((b) => `${b.slice(0, at)}${at > 0 && !/\s$/.test(b.slice(0, at)) ? ' ' : ''}${handle}${b.slice(at)}`);
    box.current?.focus();
  }

  const error = send.error instanceof ApiError && !send.error.unanswered ? send.error : undefined;
  return (
    <section aria-label={label} className="flex flex-col gap-2" data-testid={`thread-${subject}`}>
      {thread.isPending && <p role="status">Loading comments…</p>}
      {thread.isError && <Notice tone="error">{thread.error.message}</Notice>}
      {thread.data && thread.data.comments.length === 0 && <p className="text-bark-soft">No comments yet.</p>}
      {thread.data && thread.data.comments.length > 0 && (
        <ol className="flex flex-col gap-2">
          {thread.data.comments.map((c) => (
            <li key={c.id} className="rounded-lg border-2 border-line bg-panel p-2" data-testid="comment">
              <p className="whitespace-pre-wrap break-words">
                <LinkedText text={c.body} />
              </p>
              <p className="text-sm text-bark-soft">
                {c.authorName ?? 'Someone'} · {when(c.createdAt)}
              </p>
            </li>
          ))}
        </ol>
      )}
      <form
        className="flex flex-col gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (body.trim()) send.mutate({ subject, subjectId, body });
        }}
      >
        <label htmlFor={id} className="font-bold">
          Add a comment
        </label>
        <textarea
          id={id}
          ref={box}
          value={body}
          onChange={(e) => setBody(e.target.value)}
          rows={3}
          maxLength={COMMENT_MAX_LENGTH}
          className="rounded-lg border-2 border-line bg-panel p-2"
          aria-describedby={`${id}-hint`}
        />
        <p id={`${id}-hint`} className="text-sm text-bark-faint">
          Plain text; links work. Mention someone to send them an e-mail.
        </p>
        <div className="flex flex-wrap items-center gap-2">
          {crew.data && (
            <Select aria-label="Mention someone" value="" onChange={(e) => mention(e.target.value)} className="max-w-full">
              <option value="">@ Mention someone…</option>
              {crew.data.map((m) => (
                <option key={m.userId} value={m.userId}>
                  {memberLabel(m)} ({m.role})
                </option>
              ))}
            </Select>
          )}
          <Button type="submit" disabled={send.isPending || !body.trim()}>
            {send.isPending ? 'Sending…' : 'Comment'}
          </Button>
        </div>
        {send.isError && (
          <Notice tone="error">
            {error
              ? `${error.message}${error.fields?.body ? ` ${error.fields.body.join(' ')}` : ''}`
              : 'No connection to Vineward. Your comment is still here; try again.'}
          </Notice>
        )}
      </form>
    </section>
  );
}
