import type { IncomingMessage, Server } from 'node:http';

export const PEER_HEADER: string;
export function listenHost(env?: Record<string, string | undefined>): string;
export function jobWorkerMode(dev: boolean, env?: Record<string, string | undefined>): 'process' | 'inline';
export function stampPeer(req: IncomingMessage, key: string): void;
export function startServer(options?: { dev?: boolean; port?: number; host?: string }): Promise<Server>;
