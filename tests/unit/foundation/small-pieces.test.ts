import { describe, expect, it } from 'vitest';
import { safeNext } from '@/app/(auth)/safe-next';
import { escapeHtml, invitationMail } from '@/lib/mail/templates';
import { WriteLock } from '@/db/connection';

describe('safeNext', () => {
  it.each([
    ['/w/lab', '/w/lab'],
    ['//evil.example', '/w'],
    ['/\\evil.example', '/w'],
    ['https://evil.example', '/w'],
    [undefined, '/w'],
    ['', '/w'],
    ['/w/lab/benchmarks?tab=pairs#top', '/w/lab/benchmarks?tab=pairs#top'],
  ])('%s → %s', (input, expected) => {
    expect(safeNext(input)).toBe(expected);
  });

  // Known bypass shapes, each as the page receives it (already decoded once) and still encoded.
  const bypasses = [
    '/\t/evil.example/x',
    '/\n/evil.example/x',
    '/\r\n/evil.example',
    '/ /evil.example',
    '\t//evil.example',
    ' //evil.example',
    '/\u00a0/evil.example',
    '/\u3000/evil.example',
    '/%09/evil.example/x',
    '/%0a/evil.example/x',
    '/%0D%0A/evil.example',
    '/%2509/evil.example',
    '%2F%2Fevil.example',
    '/%2Fevil.example',
    '/%2F%2Fevil.example',
    '/%5Cevil.example',
    '/%5C%5Cevil.example',
    '/\\evil.example',
    '\\\\evil.example',
    '//evil.example/x',
    '///evil.example',
    'https://evil.example',
    'HTTPS://evil.example',
    'https:%2F%2Fevil.example',
    '%68ttps://evil.example',
    'javascript:alert(1)',
    'java%0ascript:alert(1)',
    '/%E0%A4%A',
    'evil.example',
  ];

  it.each(bypasses)('refuses %j', (input) => {
    expect(safeNext(input)).toBe('/w');
    // whatever is returned must stay on this origin when a browser resolves it
    expect(new URL(safeNext(input), 'http://ledger.test').origin).toBe('http://ledger.test');
  });
});

describe('mail templates', () => {
  it('escapes every interpolated value in HTML', () => {
    expect(escapeHtml(`<img src=x onerror="a">&'`)).toBe('&lt;img src=x onerror=&quot;a&quot;&gt;&amp;&#39;');
    const mail = invitationMail({ to: 'a@example.org', workspaceName: '<script>x</script>', inviterName: 'Eve', role: 'reviewer', url: 'http://localhost/invitations/1' });
    expect(mail.htmlBody).not.toContain('<script>');
    expect(mail.htmlBody).toContain('&lt;script&gt;');
    expect(mail.textBody).toContain('http://localhost/invitations/1');
  });

  it('lets a long link break anywhere instead of widening the message', () => {
    const url = `http://localhost/reset-password?token=${'x'.repeat(180)}`;
    const mail = invitationMail({ to: 'a@example.org', workspaceName: 'Lab', inviterName: 'Eve', role: 'reviewer', url });
    const pasted = mail.htmlBody.split('<p').find((p) => p.includes('Or paste this link'))!;
    expect(pasted).toContain('overflow-wrap:anywhere');
    expect(pasted).toContain('word-break:break-all');
    expect(pasted).toContain(`>${url}</a>`);
  });
});

describe('WriteLock', () => {
  it('runs holders one at a time, in arrival order', async () => {
    const lock = new WriteLock();
    const log: string[] = [];
    const task = async (name: string, ms: number) => {
      const release = await lock.acquire();
      log.push(`start ${name}`);
      await new Promise((r) => setTimeout(r, ms));
      log.push(`end ${name}`);
      release();
    };
    await Promise.all([task('a', 15), task('b', 1), task('c', 5)]);
    expect(log).toEqual(['start a', 'end a', 'start b', 'end b', 'start c', 'end c']);
  });

  it('ignores a second release', async () => {
    const lock = new WriteLock();
    const release = await lock.acquire();
    release();
    release();
    const again = await lock.acquire();
    again();
    expect(lock.queued).toBe(0);
  });
});
