import { describe, expect, it } from 'vitest';
import { parseNameList, parsePersonName } from '@/lib/citations/names';
import { formatAuthors, formatPersonName, shortAuthors, authorsSortText } from '@/lib/citations/authors';

// Names of real authors from shared/reference/check-values.md (Azuhata et al. 1995, Ananthanarayanan 1961,
// Hass & Henvis 1962, Chase 1998) and common name patterns (common practice); the rest are invented.
describe('parsePersonName', () => {
  it.each([
    ['Azuhata, T.', { family: 'Azuhata', given: 'T.' }],
    ['Azuhata T.', { family: 'Azuhata', given: 'T.' }],
    ['T. Azuhata', { family: 'Azuhata', given: 'T.' }],
    ['Takashi Azuhata', { family: 'Azuhata', given: 'Takashi' }],
    ['Ananthanarayanan K. P.', { family: 'Ananthanarayanan', given: 'K. P.' }],
    ['Ananthanarayanan, K. P.', { family: 'Ananthanarayanan', given: 'K. P.' }],
    ['Henvis BW', { family: 'Henvis', given: 'B. W.' }],
    ['van der Waals, J. D.', { family: 'Waals', given: 'J. D.', particle: 'van der' }],
    ['van der Waals J. D.', { family: 'Waals', given: 'J. D.', particle: 'van der' }],
    ['Johannes Diderik van der Waals', { family: 'Waals', given: 'Johannes Diderik', particle: 'van der' }],
    ['Ludwig von Mises', { family: 'Mises', given: 'Ludwig', particle: 'von' }],
    ['de la Fuente, José', { family: 'Fuente', given: 'José', particle: 'de la' }],
    ['Kessel-Brandt, Mira', { family: 'Kessel-Brandt', given: 'Mira' }],
    ['Jean-Pierre Serre', { family: 'Serre', given: 'Jean-Pierre' }],
    ['Kessel-Brandt M.', { family: 'Kessel-Brandt', given: 'M.' }],
    ['Chase, Jr., M. W.', { family: 'Chase', given: 'M. W.', suffix: 'Jr.' }],
    ['Chase, M. W., Jr.', { family: 'Chase', given: 'M. W.', suffix: 'Jr.' }],
    ['M. W. Chase Jr.', { family: 'Chase', given: 'M. W.', suffix: 'Jr.' }],
    ['{Halden Phonon Group}', { literal: 'Halden Phonon Group' }],
    ['CODATA Task Group', { literal: 'CODATA Task Group' }],
  ])('%s', (text, expected) => {
    expect(parsePersonName(text)).toEqual(expected);
  });

  it.each(['Plato', 'Smith J. (2020)', 'Azuhata T. et al.', 'a b c d e f g h', 'J. 3rd'])('keeps "%s" as written, marked for review', (text) => {
    expect(parsePersonName(text)).toEqual({ literal: text, review: true });
  });
});

describe('parseNameList', () => {
  const azuhata = [
    { family: 'Azuhata', given: 'T.' },
    { family: 'Sota', given: 'T.' },
    { family: 'Suzuki', given: 'K.' },
    { family: 'Nakamura', given: 'S.' },
  ];
  it.each([
    'Azuhata T.; Sota T.; Suzuki K.; Nakamura S.',
    'Azuhata, T. and Sota, T. and Suzuki, K. and Nakamura, S.',
    'T. Azuhata, T. Sota, K. Suzuki and S. Nakamura',
    'T. Azuhata, T. Sota, K. Suzuki, and S. Nakamura',
    'Azuhata T, Sota T, Suzuki K, Nakamura S',
    'Azuhata, T., Sota, T., Suzuki, K., Nakamura, S.',
    'Azuhata, T.\nSota, T.\nSuzuki, K.\nNakamura, S.',
  ])('splits "%s" into four people', (text) => {
    expect(parseNameList(text)).toEqual(azuhata);
  });

  it('reads one "Family, Given" name as one person, not two', () => {
    expect(parseNameList('van der Waals, Johannes Diderik')).toEqual([{ family: 'Waals', given: 'Johannes Diderik', particle: 'van der' }]);
    expect(parseNameList('Hass, M. & Henvis, B. W.')).toEqual([
      { family: 'Hass', given: 'M.' },
      { family: 'Henvis', given: 'B. W.' },
    ]);
  });
});

describe('the one display format', () => {
  const names = parseNameList('Azuhata T.; Sota T.; Suzuki K.; Nakamura S.');
  it('is the same whether the names came as BibTeX or typed', () => {
    expect(formatAuthors(parseNameList('Azuhata, Takashi and Sota, T. and Suzuki, K. and Nakamura, Shuji'))).toBe(formatAuthors(names));
    expect(formatAuthors(names)).toBe('T. Azuhata, T. Sota, K. Suzuki and S. Nakamura');
  });
  it('shortens long lists and citations', () => {
    expect(formatAuthors(names, 3)).toBe('T. Azuhata, T. Sota, K. Suzuki et al.');
    expect(shortAuthors(names)).toBe('Azuhata et al.');
    expect(shortAuthors(parseNameList('Hass M.; Henvis B. W.'))).toBe('Hass and Henvis');
  });
  it('keeps particles, hyphens, suffixes and organisations', () => {
    expect(formatPersonName({ family: 'Waals', given: 'Johannes Diderik', particle: 'van der' })).toBe('J. D. van der Waals');
    expect(formatPersonName({ family: 'Serre', given: 'Jean-Pierre' })).toBe('J.-P. Serre');
    expect(formatPersonName({ family: 'Chase', given: 'Malcolm W.', suffix: 'Jr.' })).toBe('M. W. Chase Jr.');
    expect(formatPersonName({ literal: 'Halden Phonon Group' })).toBe('Halden Phonon Group');
  });
  it('sorts and searches by family name first', () => {
    expect(authorsSortText(names)).toBe('Azuhata, T.; Sota, T.; Suzuki, K.; Nakamura, S.');
    expect(authorsSortText([])).toBeNull();
  });
});
