/** A discussion thread as pages and the thread panel show it (shared by server queries and client components). */
import type { THREAD_SUBJECTS } from '@/lib/record-kinds';

export type ThreadSubjectKind = (typeof THREAD_SUBJECTS)[number];

export interface CommentView {
  id: string;
  body: string;
  authorName: string | null;
  createdAt: Date;
}

export interface ThreadView {
  id: string;
  subjectKind: ThreadSubjectKind;
  subjectId: string;
  benchmarkId: string | null;
  createdAt: Date;
  resolvedAt: Date | null;
  resolvedByName: string | null;
  comments: CommentView[];
  decisions: Array<{ id: string; kind: string; reason: string; createdAt: Date; revertedAt: Date | null; byName: string | null }>;
}
