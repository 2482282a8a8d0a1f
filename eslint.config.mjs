import nextCoreWebVitals from 'eslint-config-next/core-web-vitals';
import nextTypescript from 'eslint-config-next/typescript';
import { GATE_FILES, LAYERS, OUTSIDE } from './scripts/layers.mjs';

// How an import names each layer (the '@/' alias); scripts/check-layers.mjs also checks relative imports and cycles.
const SPECIFIERS = {
  science: ['@/lib/science', '@/lib/science/**'],
  services: ['@/lib/services/**'],
  gates: GATE_FILES.map((f) => `@/${f.replace(/\.ts$/, '')}`),
  db: ['@/db/**'],
  components: ['@/components/**'],
  app: ['@/app/**'],
};
const FILES = {
  science: { files: ['lib/science/**'] },
  lib: { files: ['lib/**'], ignores: ['lib/science/**', 'lib/services/**', ...GATE_FILES] },
  db: { files: ['db/**'], ignores: OUTSIDE.filter((p) => p.startsWith('db/')) },
  services: { files: ['lib/services/**'] },
  gates: { files: GATE_FILES },
  components: { files: ['components/**'] },
};

function layerRule(layer) {
  const forbidden = Object.keys(SPECIFIERS).filter((other) => other !== layer.name && !layer.may.includes(other));
  // A layer that may import nothing else (science) is closed to every '@/' module outside itself.
  const group = layer.may.length === 0 ? ['@/**', ...SPECIFIERS[layer.name].map((s) => `!${s}`)] : forbidden.flatMap((other) => SPECIFIERS[other]);
  return {
    ...FILES[layer.name],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group,
              message: `${layer.holds} may import only ${layer.may.join(', ') || 'itself'} (layers in scripts/layers.mjs; README "Layout").`,
            },
          ],
        },
      ],
    },
  };
}

const config = [
  { ignores: ['.next/**', 'node_modules/**', 'drizzle/**', '.data/**', 'next-env.d.ts', 'test-results/**', 'bench/out/**', 'tests/fixtures/lint/**'] },
  ...nextCoreWebVitals,
  ...nextTypescript,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  ...LAYERS.filter((l) => FILES[l.name]).map(layerRule),
];

export default config;
