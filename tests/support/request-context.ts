/** The "current request" seen by server code under test (next/headers is mocked to read it). */
class RequestContext {
  private cookieJar = new Map<string, string>();
  private extra: Record<string, string> = {};

  /** Headers the next requests carry besides origin and cookie (e.g. the peer stamp of scripts/server.mjs). */
  setHeaders(extra: Record<string, string>) {
    this.extra = { ...extra };
  }

  headers(): Headers {
    const h = new Headers({ origin: process.env.BETTER_AUTH_URL ?? 'http://localhost:3999', ...this.extra });
    if (this.cookieJar.size > 0) h.set('cookie', [...this.cookieJar].map(([k, v]) => `${k}=${v}`).join('; '));
    return h;
  }

  cookies() {
    const jar = this.cookieJar;
    return {
      get: (name: string) => (jar.has(name) ? { name, value: jar.get(name)! } : undefined),
      getAll: () => [...jar].map(([name, value]) => ({ name, value })),
      has: (name: string) => jar.has(name),
      set: (name: string, value: string) => {
        jar.set(name, value);
      },
      delete: (name: string) => {
        jar.delete(name);
      },
    };
  }

  /** Acts as nobody (anonymous request). */
  anonymous() {
    this.cookieJar.clear();
  }

  /** Acts as the holder of these Set-Cookie headers. */
  useSetCookies(setCookies: string[]) {
    this.cookieJar.clear();
    for (const c of setCookies) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      this.cookieJar.set(pair.slice(0, i), pair.slice(i + 1));
    }
  }
}

export const requestContext = new RequestContext();
