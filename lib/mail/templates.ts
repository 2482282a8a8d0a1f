import type { OutgoingMail } from '@/lib/mail/outgoing';

/** Escapes text for HTML bodies; every value put into a template goes through it. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/**
 * Long links (a 200-character token URL) would widen a phone's mail view: every
 * paragraph may break anywhere, the pasted link above all.
 */
export const WRAP_ANYWHERE = 'overflow-wrap:anywhere;word-break:break-word';

function layout(title: string, paragraphs: string[], action?: { label: string; url: string }): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 12px;${WRAP_ANYWHERE}">${escapeHtml(p)}</p>`).join('');
  const button = action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(action.url)}" style="display:inline-block;background:#1f4e5f;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p><p style="font-size:12px;color:#555;${WRAP_ANYWHERE};word-break:break-all">Or paste this link into your browser: <a href="${escapeHtml(action.url)}" style="color:#1f4e5f">${escapeHtml(action.url)}</a></p>`
    : '';
  return `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1a1a1a;max-width:560px;margin:24px auto;padding:0 16px"><h1 style="font-size:18px">${escapeHtml(title)}</h1>${body}${button}<hr style="border:none;border-top:1px solid #ddd;margin:24px 0"><p style="font-size:12px;color:#666">Lattice Ledger</p></body></html>`;
}

function text(paragraphs: string[], action?: { label: string; url: string }): string {
  return [...paragraphs, ...(action ? [`${action.label}: ${action.url}`] : []), '', '— Lattice Ledger'].join('\n\n');
}

export function verifyEmailMail({ to, name, url }: { to: string; name: string; url: string }): OutgoingMail {
  const paragraphs = [`Hello ${name},`, 'Confirm your e-mail address to finish creating your Lattice Ledger account. The link is valid for 24 hours.'];
  const action = { label: 'Confirm e-mail address', url };
  return {
    kind: 'verify-email',
    toAddress: to,
    subject: 'Confirm your e-mail address',
    textBody: text(paragraphs, action),
    htmlBody: layout('Confirm your e-mail address', paragraphs, action),
  };
}

export function resetPasswordMail({ to, name, url }: { to: string; name: string; url: string }): OutgoingMail {
  const paragraphs = [
    `Hello ${name},`,
    'Someone asked to reset the password of your Lattice Ledger account. The link is valid for one hour. Setting a new password signs you out everywhere.',
    'If it was not you, ignore this message: your password stays as it is.',
  ];
  const action = { label: 'Choose a new password', url };
  return {
    kind: 'reset-password',
    toAddress: to,
    subject: 'Reset your password',
    textBody: text(paragraphs, action),
    htmlBody: layout('Reset your password', paragraphs, action),
  };
}

export function invitationMail(input: { to: string; workspaceName: string; inviterName: string; role: string; url: string }): OutgoingMail {
  const paragraphs = [
    `${input.inviterName} invited you to the workspace “${input.workspaceName}” on Lattice Ledger as ${input.role}.`,
    `Sign in (or create an account) with this e-mail address, ${input.to}, to accept. The invitation expires in 7 days.`,
  ];
  const action = { label: 'Open the invitation', url: input.url };
  return {
    kind: 'invitation',
    toAddress: input.to,
    subject: `Invitation to ${input.workspaceName}`,
    textBody: text(paragraphs, action),
    htmlBody: layout(`Join ${input.workspaceName}`, paragraphs, action),
  };
}

export function existingAccountMail(input: { to: string; name: string; signInUrl: string; resetUrl: string }): OutgoingMail {
  const paragraphs = [
    `Hello ${input.name},`,
    'Someone tried to create a Lattice Ledger account with this e-mail address, which already has one. Nothing was changed.',
    `If it was you, sign in (${input.signInUrl}) or reset your password (${input.resetUrl}).`,
  ];
  return {
    kind: 'existing-account',
    toAddress: input.to,
    subject: 'You already have an account',
    textBody: text(paragraphs),
    htmlBody: layout('You already have an account', paragraphs, { label: 'Sign in', url: input.signInUrl }),
  };
}
