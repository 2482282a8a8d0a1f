import { toNextJsHandler } from 'better-auth/next-js';
import { getAuth } from '@/lib/auth';

// better-auth's own handler: it authenticates its endpoints itself.
export async function GET(request: Request) {
  return toNextJsHandler(getAuth()).GET(request);
}

export async function POST(request: Request) {
  return toNextJsHandler(getAuth()).POST(request);
}
