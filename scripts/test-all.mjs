// npm test: lint, layers, typecheck, unit, integration, build, end-to-end — stops at the first failure.
import { run } from './run.mjs';

const buildEnv = {
  ...process.env,
  NEXT_TELEMETRY_DISABLED: '1',
  // The build imports route modules, which read these; they are throwaway values for the build only.
  BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET || 'build-only-secret-0123456789abcdef012345',
  BETTER_AUTH_URL: process.env.BETTER_AUTH_URL || 'http://localhost:3000',
  DATABASE_URL: process.env.DATABASE_URL || 'file:./.data/build.db',
};

const steps = [
  ['lint', 'node', ['node_modules/eslint/bin/eslint.js', '.', '--max-warnings=0']],
  ['layers', 'node', ['scripts/check-layers.mjs']],
  ['typecheck', 'node', ['node_modules/typescript/bin/tsc', '--noEmit']],
  ['unit', 'node', ['node_modules/vitest/vitest.mjs', 'run', '--project', 'unit']],
  ['integration', 'node', ['node_modules/vitest/vitest.mjs', 'run', '--project', 'integration']],
  ['env', 'node', ['node_modules/tsx/dist/cli.mjs', 'scripts/check-env.ts']],
  ['build', 'node', ['node_modules/next/dist/bin/next', 'build']],
  ['e2e', 'node', ['node_modules/vitest/vitest.mjs', 'run', '--project', 'e2e']],
];

const only = process.argv.slice(2);
const timings = [];
for (const [name, cmd, args] of steps) {
  if (only.length && !only.includes(name)) continue;
  const started = Date.now();
  console.log(`\n=== ${name} ===`);
  try {
    await run(cmd, args, buildEnv);
  } catch (e) {
    console.error(`\n${name} failed: ${e.message}`);
    process.exit(1);
  }
  timings.push(`${name} ${((Date.now() - started) / 1000).toFixed(1)} s`);
}
console.log(`\nAll steps passed (${timings.join(', ')}).`);
