type Action = (prev: never, formData: FormData) => Promise<unknown>;

export type ActionOutcome = { state?: { ok: boolean; code?: string; message?: string; fieldErrors?: Record<string, string[]> }; redirect?: string; notFound?: boolean };

/** Calls a server action like a form post; a redirect() or notFound() inside it is reported, not thrown. */
export async function callAction(action: Action, fields: Record<string, string>): Promise<ActionOutcome> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  try {
    return { state: (await action(undefined as never, form)) as ActionOutcome['state'] };
  } catch (e) {
    const digest = (e as { digest?: string }).digest ?? '';
    if (digest.startsWith('NEXT_REDIRECT')) return { redirect: digest.split(';')[2] };
    if (digest.startsWith('NEXT_HTTP_ERROR_FALLBACK;404')) return { notFound: true };
    throw e;
  }
}
