export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    // Fail at start-up, with the list of bad variables, rather than on the first request.
    const { env } = await import('@/lib/env');
    env();
    const { startMailWorker } = await import('@/lib/services/mail/worker');
    startMailWorker();
    (await import('@/lib/services/alerts/scheduler')).startDigestTimer();
  }
}
