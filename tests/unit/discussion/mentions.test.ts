import { describe, expect, it } from 'vitest';
import { findMentions, handlesOf, resolveMentions } from '@/lib/discussion/mentions';

const members = [
  { userId: 'u1', name: 'Tomas Ferreira', email: 'tomas.ferreira@example.org' },
  { userId: 'u2', name: 'Lena Okafor', email: 'lena.okafor@example.org' },
  { userId: 'u3', name: 'Zoë Ångström', email: 'zoe@example.org' },
];

describe('mentions', () => {
  it('finds handles, not e-mail addresses', () => {
    expect(findMentions('@lena.okafor see lena.okafor@example.org, and (@tomas)').map((m) => m.handle)).toEqual(['lena.okafor', 'tomas']);
  });

  it('drops trailing punctuation from a handle', () => {
    expect(findMentions('thanks @lena.okafor.').map((m) => m.handle)).toEqual(['lena.okafor']);
    expect(findMentions('@lena.okafor, look')[0]).toEqual({ handle: 'lena.okafor', start: 0, end: 12 });
  });

  it('answers to the e-mail local part and the dotted name, case and accents ignored', () => {
    expect(handlesOf(members[2])).toEqual(['zoe', 'zoe.angstrom']);
    const found = resolveMentions('@Lena.Okafor and @zoe.angstrom and @ZOE', members);
    expect(found.map((m) => m.userId)).toEqual(['u2', 'u3']);
  });

  it('ignores a mention of someone who is not a member', () => {
    expect(resolveMentions('@mallory.evil please look, and @tomas.ferreira', members).map((m) => m.userId)).toEqual(['u1']);
    expect(resolveMentions('@mallory.evil', members)).toEqual([]);
  });
});
