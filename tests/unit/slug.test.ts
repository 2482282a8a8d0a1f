import { describe, expect, it } from 'vitest';
import { SLUG_MAX, slugFromName } from '@/lib/slug';

describe('slugFromName', () => {
  it('derives an address from a workspace name', () => {
    expect(slugFromName('Phonon group, Dept. of Physics')).toBe('phonon-group-dept-of-physics');
    expect(slugFromName('  Lattice Dynamics Lab  ')).toBe('lattice-dynamics-lab');
    expect(slugFromName('Ångström Laboratory — Raman & IR')).toBe('angstrom-laboratory-raman-and-ir');
    expect(slugFromName('Straße Gruppe Ørsted')).toBe('strasse-gruppe-orsted');
    expect(slugFromName('ΓΓΓ')).toBe('');
  });

  it('matches the server rule (lower-case, digits, single hyphens) and stays within the length limit', () => {
    const long = slugFromName('Computational materials science group of the department of condensed matter physics');
    expect(long.length).toBeLessThanOrEqual(SLUG_MAX);
    expect(long).toMatch(/^[a-z0-9]+(?:-[a-z0-9]+)*$/);
    expect(long).toBe('computational-materials-science-group-of-the');
  });
});
