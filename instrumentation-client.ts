import { z } from 'zod';

// zod 4 probes `new Function` to compile fast parsers; the Content-Security-Policy forbids eval,
// and the probe alone would be reported as a violation. Parse without the JIT in the browser.
z.config({ jitless: true });
