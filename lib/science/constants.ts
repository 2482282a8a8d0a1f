/**
 * Physical constants, CODATA 2018 (exact in the 2019 SI unless noted), and the
 * unit factors derived from them. Every other module takes its constants from here.
 */

/** Planck constant h, J s (exact). */
export const PLANCK_CONSTANT_J_S = 6.62607015e-34;
/** Speed of light in vacuum c, m s⁻¹ (exact). */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;
/** Boltzmann constant k_B, J K⁻¹ (exact). */
export const BOLTZMANN_CONSTANT_J_PER_K = 1.380649e-23;
/** Avogadro constant N_A, mol⁻¹ (exact). */
export const AVOGADRO_CONSTANT_PER_MOL = 6.02214076e23;
/** Elementary charge e, C (exact). */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** Molar gas constant R = N_A k_B, J mol⁻¹ K⁻¹ (exact by definition). */
export const MOLAR_GAS_CONSTANT_J_PER_MOL_K = AVOGADRO_CONSTANT_PER_MOL * BOLTZMANN_CONSTANT_J_PER_K;
/** Thermochemical calorie, J (definition). */
export const THERMOCHEMICAL_CALORIE_J = 4.184;

/** Energy of one wavenumber, h c × (100 cm⁻¹ per m⁻¹), in J. */
export const JOULE_PER_CM1 = PLANCK_CONSTANT_J_S * SPEED_OF_LIGHT_M_PER_S * 100;
/** Frequency of one wavenumber, c × 100 / 10¹², in THz (exactly 0.0299792458). */
export const THZ_PER_CM1 = (SPEED_OF_LIGHT_M_PER_S * 100) / 1e12;
/** Energy of one wavenumber in meV: h c 100 / e × 1000. */
export const MEV_PER_CM1 = (JOULE_PER_CM1 / ELEMENTARY_CHARGE_C) * 1000;
/** Temperature equivalent of one wavenumber, h c 100 / k_B, in K (second radiation constant c₂ in K cm). */
export const KELVIN_PER_CM1 = JOULE_PER_CM1 / BOLTZMANN_CONSTANT_J_PER_K;
