'use client';

import { useState } from 'react';
import { CommentThread } from '@/components/comments/comment-thread';
import type { CommentSubject } from '@/lib/validation/comment';

/** A thread folded away under its subject, loaded only when someone opens it. */
export function CommentToggle({ subject, subjectId, label = 'Comments' }: { subject: CommentSubject; subjectId: string; label?: string }) {
  const [open, setOpen] = useState(false);
  return (
    <details className="mt-2" onToggle={(e) => setOpen(e.currentTarget.open)}>
      <summary className="flex min-h-touch cursor-pointer items-center font-bold text-rootstock">{label}</summary>
      {open && <CommentThread subject={subject} subjectId={subjectId} label={label} />}
    </details>
  );
}
