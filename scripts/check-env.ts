// Validates the environment with the app's own schema (lib/env.ts) before `next build`, so a bad variable
// fails the build with its name rather than the first request in production.
import { env } from '../lib/env';

try {
  env();
  console.log('Environment valid.');
} catch (e) {
  console.error((e as Error).message);
  process.exit(1);
}
