import type { OutgoingMail } from '@/lib/mail/outgoing';
import { escapeHtml, WRAP_ANYWHERE } from '@/lib/mail/templates';

const EXCERPT = 600;

/** The notice a mentioned member receives; the comment is quoted as text, never as HTML. */
export function mentionMail(input: { to: string; recipientName: string; authorName: string; workspaceName: string; subject: string; body: string; url: string; commentId: string; userId: string }): OutgoingMail {
  const excerpt = input.body.length > EXCERPT ? `${input.body.slice(0, EXCERPT)}…` : input.body;
  const lead = `${input.authorName} mentioned you in a discussion on ${input.subject} in ${input.workspaceName}.`;
  const text = [`Hello ${input.recipientName},`, lead, excerpt.split('\n').map((l) => `> ${l}`).join('\n'), `Open the discussion: ${input.url}`, '— Lattice Ledger'].join('\n\n');
  const html =
    `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1a1a1a;max-width:560px;margin:24px auto;padding:0 16px">` +
    `<p>Hello ${escapeHtml(input.recipientName)},</p><p>${escapeHtml(lead)}</p>` +
    `<blockquote style="margin:12px 0;padding:8px 12px;border-left:3px solid #c3cbd2;color:#333;white-space:pre-wrap;${WRAP_ANYWHERE}">${escapeHtml(excerpt)}</blockquote>` +
    `<p><a href="${escapeHtml(input.url)}">Open the discussion</a></p>` +
    `<hr style="border:none;border-top:1px solid #ddd;margin:24px 0"><p style="font-size:12px;color:#666">Lattice Ledger</p></body></html>`;
  return {
    kind: 'mention',
    toAddress: input.to,
    subject: `${input.authorName} mentioned you: ${input.subject}`.slice(0, 200),
    textBody: text,
    htmlBody: html,
    dedupeKey: `mention:${input.commentId}:${input.userId}`,
  };
}
