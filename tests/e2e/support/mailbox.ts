import { expect } from 'vitest';

interface Message {
  id: string;
  to: string[];
  subject: string;
  text?: string;
}

/** Waits until the mail fake holds a message to `to` whose subject matches, and returns it. */
export async function waitForMail(mailURL: string, to: string, subject: RegExp, timeoutMs = 15_000): Promise<Message> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const { messages } = (await (await fetch(`${mailURL}/__mailbox`)).json()) as { messages: Message[] };
    const found = messages.find((m) => m.to.includes(to) && subject.test(m.subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 250));
  }
  expect.fail(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
}

export function firstLink(text: string | undefined): string {
  const m = text?.match(/https?:\/\/\S+/);
  if (!m) throw new Error(`no link in mail: ${text}`);
  return m[0];
}
