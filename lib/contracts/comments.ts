/** Comments: what /api/comments answers. The request schemas are in lib/validation/comment.ts. */
import type { CommentSubject } from '@/lib/validation/comment';

export interface CommentView<T = string> {
  id: string;
  subject: CommentSubject;
  subjectId: string;
  body: string;
  authorId: string | null;
  authorName: string | null;
  createdAt: T;
}

export interface CommentThread {
  comments: CommentView[];
}

export interface CommentOne {
  comment: CommentView;
}
