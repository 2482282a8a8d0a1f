import { toNextJsHandler } from 'better-auth/next-js';
import { getAuth } from '@/lib/auth';
import { guardAuthRequest } from '@/lib/auth-guard';

// better-auth's own handler: it authenticates its endpoints itself. The guard sets the client address from the
// socket and applies the per-client and per-account limits first.
export async function GET(request: Request) {
  const guarded = await guardAuthRequest(request);
  return guarded instanceof Response ? guarded : toNextJsHandler(getAuth()).GET(guarded);
}

export async function POST(request: Request) {
  const guarded = await guardAuthRequest(request);
  return guarded instanceof Response ? guarded : toNextJsHandler(getAuth()).POST(guarded);
}
