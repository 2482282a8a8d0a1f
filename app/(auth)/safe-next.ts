/** Only same-site paths may be followed after sign-in. */
export function safeNext(value: string | null | undefined, fallback = '/w'): string {
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return fallback;
  return value;
}
