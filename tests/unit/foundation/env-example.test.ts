import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ENV_SCHEMA } from '@/lib/env';

/** NODE_ENV is set by Next.js and the scripts, never by a deployment's .env. */
const SET_BY_THE_RUNTIME = ['NODE_ENV'];

const documented = readFileSync(join(__dirname, '../../../.env.example'), 'utf8')
  .split('\n')
  .map((line) => line.match(/^([A-Z][A-Z0-9_]*)=/)?.[1])
  .filter((name): name is string => Boolean(name));

describe('.env.example', () => {
  it('documents every variable of the env schema, and only those', () => {
    const declared = Object.keys(ENV_SCHEMA.shape).filter((k) => !SET_BY_THE_RUNTIME.includes(k));
    expect([...documented].sort()).toEqual([...declared].sort());
  });

  it('gives each variable a comment above it', () => {
    const lines = readFileSync(join(__dirname, '../../../.env.example'), 'utf8').split('\n');
    const uncommented = documented.filter((name) => {
      let i = lines.findIndex((l) => l.startsWith(`${name}=`)) - 1;
      while (i >= 0 && /^[A-Z][A-Z0-9_]*=/.test(lines[i])) i--;
      return i < 0 || !lines[i].startsWith('#');
    });
    expect(uncommented).toEqual([]);
  });
});
