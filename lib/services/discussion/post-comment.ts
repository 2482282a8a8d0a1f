import 'server-only';
/**
 * Posting a comment: the comment and one mail per member it mentions (the
 * author and non-members excepted) are stored in one transaction.
 */
import { insertComment, workspaceName, type PostCommentInput } from '@/db/queries/comments';
import { listMembers } from '@/db/queries/workspaces';
import { mentionMail } from '@/lib/discussion/mention-mail';
import { normaliseCommentBody, resolveMentions } from '@/lib/discussion/mentions';

export async function postComment(
  workspaceId: string,
  author: { userId: string; name: string },
  input: PostCommentInput,
): Promise<{ threadId: string; commentId: string; mentioned: string[] }> {
  const [members, wsName] = await Promise.all([listMembers(workspaceId), workspaceName(workspaceId)]);
  const mentioned = resolveMentions(
    normaliseCommentBody(input.body),
    members.map((m) => ({ userId: m.userId, name: m.name, email: m.email })),
  ).filter((m) => m.userId !== author.userId);
  const posted = await insertComment(workspaceId, author, input, ({ commentId, body, subjectText }) =>
    mentioned.map((m) =>
      mentionMail({
        to: m.email,
        recipientName: m.name,
        authorName: author.name,
        workspaceName: wsName ?? 'your workspace',
        subject: subjectText,
        body,
        url: input.url,
        commentId,
        userId: m.userId,
      }),
    ),
  );
  return { ...posted, mentioned: mentioned.map((m) => m.userId) };
}
