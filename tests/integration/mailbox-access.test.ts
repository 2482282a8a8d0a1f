import { afterEach, describe, expect, it } from 'vitest';
import MailboxPage from '@/app/dev/mailbox/page';
import { PEER_HEADER, peerStamp } from '@/lib/client-address';
import { requestContext } from '../support/request-context';

// Outside production the mailbox is on: what is left to prove is who may see it.
const open = () => MailboxPage({ searchParams: Promise.resolve({}) });
const notFound = { digest: expect.stringMatching(/^NEXT_HTTP_ERROR_FALLBACK;404/) };

describe('/dev/mailbox answers only loopback clients', () => {
  afterEach(() => requestContext.setHeaders({}));

  it('renders for a client on this machine (IPv4 and IPv6 loopback)', async () => {
    for (const address of ['127.0.0.1', '::1', '::ffff:127.0.0.1']) {
      requestContext.setHeaders({ [PEER_HEADER]: peerStamp(address) });
      await expect(open()).resolves.toBeTruthy();
    }
  });

  it('is not found for a client on the network', async () => {
    requestContext.setHeaders({ [PEER_HEADER]: peerStamp('192.168.1.20') });
    await expect(open()).rejects.toMatchObject(notFound);
  });

  it('is not found through a proxy on this machine (loopback peer, forwarded request)', async () => {
    requestContext.setHeaders({ [PEER_HEADER]: peerStamp('127.0.0.1', true), 'x-forwarded-for': '203.0.113.9' });
    await expect(open()).rejects.toMatchObject(notFound);
  });

  it('is not found when the peer is unknown or the stamp forged', async () => {
    await expect(open()).rejects.toMatchObject(notFound);
    requestContext.setHeaders({ [PEER_HEADER]: 'not-the-key 127.0.0.1 direct' });
    await expect(open()).rejects.toMatchObject(notFound);
  });
});
