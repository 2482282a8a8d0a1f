export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { startMailWorker } = await import('@/lib/mail/worker');
    startMailWorker();
  }
}
