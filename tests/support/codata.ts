// CODATA 2018 / SI 2019 exact constants (reference/check-values.md), written out here so that
// tests check lib/science against values typed independently of it.
export const h = 6.62607015e-34;
export const c = 299792458;
export const kB = 1.380649e-23;
export const R = 6.02214076e23 * kB;
