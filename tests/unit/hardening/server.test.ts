import { createServer, request as httpRequest, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jobWorkerMode, listenHost, PEER_HEADER, stampPeer } from '../../../scripts/server.mjs';
import { mailboxEnabled, startupWarnings } from '@/lib/env';

describe('the server every script starts (scripts/server.mjs)', () => {
  it('listens on 127.0.0.1 unless HOST says otherwise', () => {
    expect(listenHost({})).toBe('127.0.0.1');
    expect(listenHost({ HOST: '' })).toBe('127.0.0.1');
    expect(listenHost({ HOST: '0.0.0.0' })).toBe('0.0.0.0');
  });

  it('runs the jobs in a worker process in production and in the server under --dev, unless JOB_WORKER says otherwise', () => {
    expect(jobWorkerMode(false, {})).toBe('process');
    expect(jobWorkerMode(true, {})).toBe('inline');
    expect(jobWorkerMode(false, { JOB_WORKER: 'inline' })).toBe('inline');
    expect(jobWorkerMode(true, { JOB_WORKER: 'process' })).toBe('process');
    expect(jobWorkerMode(false, { JOB_WORKER: 'bogus' })).toBe('process');
  });

  describe('stamps the TCP peer over whatever the client sent', () => {
    let server: Server;
    let port: number;
    beforeAll(async () => {
      server = createServer((req, res) => {
        stampPeer(req, 'process-key');
        res.end(String(req.headers[PEER_HEADER]));
      });
      await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
      port = (server.address() as AddressInfo).port;
    });
    afterAll(() => new Promise<void>((r) => server.close(() => r())));

    const get = (headers: Record<string, string>) =>
      new Promise<string>((resolve, reject) => {
        const req = httpRequest({ host: '127.0.0.1', port, path: '/', headers }, (res) => {
          let body = '';
          res.on('data', (c) => (body += c));
          res.on('end', () => resolve(body));
        });
        req.on('error', reject);
        req.end();
      });

    it('a forged stamp is overwritten; forwarding headers are noted', async () => {
      expect(await get({ [PEER_HEADER]: 'process-key 198.51.100.7 direct' })).toBe('process-key 127.0.0.1 direct');
      expect(await get({ 'x-forwarded-for': '198.51.100.7' })).toBe('process-key 127.0.0.1 forwarded');
    });
  });
});

describe('the development mailbox in production', () => {
  it('is off unless UNSAFE_MAILBOX_IN_PRODUCTION=1 (MAILBOX_ENABLED does not count), and then warns at start-up', () => {
    expect(mailboxEnabled({ NODE_ENV: 'production', MAILBOX_ENABLED: true, UNSAFE_MAILBOX_IN_PRODUCTION: '' })).toBe(false);
    expect(mailboxEnabled({ NODE_ENV: 'production', MAILBOX_ENABLED: undefined, UNSAFE_MAILBOX_IN_PRODUCTION: '0' })).toBe(false);
    expect(startupWarnings({ NODE_ENV: 'production', MAILBOX_ENABLED: true, UNSAFE_MAILBOX_IN_PRODUCTION: '' })).toEqual([]);
    expect(mailboxEnabled({ NODE_ENV: 'production', MAILBOX_ENABLED: undefined, UNSAFE_MAILBOX_IN_PRODUCTION: '1' })).toBe(true);
    expect(startupWarnings({ NODE_ENV: 'production', MAILBOX_ENABLED: undefined, UNSAFE_MAILBOX_IN_PRODUCTION: '1' })[0]).toMatch(/UNSAFE_MAILBOX_IN_PRODUCTION=1.*password-reset links/);
  });

  it('is on in development unless switched off', () => {
    expect(mailboxEnabled({ NODE_ENV: 'development', MAILBOX_ENABLED: undefined, UNSAFE_MAILBOX_IN_PRODUCTION: '' })).toBe(true);
    expect(mailboxEnabled({ NODE_ENV: 'development', MAILBOX_ENABLED: false, UNSAFE_MAILBOX_IN_PRODUCTION: '' })).toBe(false);
  });
});
