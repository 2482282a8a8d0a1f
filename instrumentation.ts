export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    // Fail at start-up, with the list of bad variables, rather than on the first request.
    const { env, startupWarnings } = await import('@/lib/env');
    env();
    // Spool folders of imports killed mid-way (their cleanup never ran) are removed before serving.
    const removed = await (await import('@/lib/import/spool')).removeStaleSpools();
    if (removed.length) console.log(`Removed ${removed.length} temporary folder(s) left by interrupted imports.`);
    (await import('@/lib/client-address')).parseTrustedProxies(env().TRUSTED_PROXIES);
    for (const warning of startupWarnings()) console.warn(`WARNING: ${warning}`);
    const { startMailWorker } = await import('@/lib/services/mail/worker');
    startMailWorker();
    // Loading these registers their job handlers, so this process also runs jobs queued by the others.
    await import('@/lib/services/benchmarks/recompute-queue');
    await (await import('@/lib/services/alerts/scheduler')).startDigestTimer();
  }
}
