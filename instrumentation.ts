export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    // Fail at start-up, with the list of bad variables, rather than on the first request.
    const { env, startupWarnings } = await import('@/lib/env');
    env();
    (await import('@/lib/client-address')).parseTrustedProxies(env().TRUSTED_PROXIES);
    for (const warning of startupWarnings()) console.warn(`WARNING: ${warning}`);
    const { startMailWorker } = await import('@/lib/mail/worker');
    startMailWorker();
    (await import('@/lib/alerts/scheduler')).startDigestTimer();
  }
}
