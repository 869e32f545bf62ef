/**
 * Physical constants and exact unit factors used by the physics core, each with its source.
 * All values are SI. Nothing here is adjustable: these are definitions or CODATA values.
 */

/**
 * Molar gas constant R in J/(mol·K).
 * Source: CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93 (2021) 025010); exact since the 2019 SI
 * redefinition, R = N_A · k = 6.02214076e23 mol⁻¹ × 1.380649e-23 J/K.
 */
export const GAS_CONSTANT_J_PER_MOL_K = 8.314462618

/** Standard atmosphere in Pa. Source: 10th CGPM (1954), Resolution 4; ISO 2533:1975. Exact by definition. */
export const STANDARD_ATMOSPHERE_PA = 101_325

/** 0 °C in kelvin. Source: SI Brochure, 9th ed. (2019), §2.3.1 (t/°C = T/K − 273.15). Exact. */
export const ZERO_CELSIUS_K = 273.15

/** 1 bar in Pa. Source: SI Brochure, 9th ed. (2019), Table 8 (1 bar = 100 kPa). Exact. */
export const PA_PER_BAR = 100_000

/**
 * 1 pound-force per square inch (psi) in Pa, from the international pound (0.45359237 kg, 1959 agreement),
 * standard gravity 9.80665 m/s² (3rd CGPM 1901) and the international inch (0.0254 m):
 * 0.45359237 × 9.80665 / 0.0254² = 6894.757293168361 Pa. NIST SP 811 (2008) App. B.8 lists 6.894 757 E+03.
 */
export const PA_PER_PSI = (0.45359237 * 9.80665) / (0.0254 * 0.0254)

/** 1 cubic foot in m³ (international foot = 0.3048 m, exact; NIST SP 811 App. B.8: 2.831 685 E−02). */
export const M3_PER_CUBIC_FOOT = 0.3048 ** 3

/** 1 pound (avoirdupois) in kg. Source: international yard and pound agreement (1959); NIST SP 811 App. B.8. Exact. */
export const KG_PER_POUND = 0.45359237

/**
 * Oxidising-power limit of ISO 10156: a gas or mixture is "more oxidising than air" above 23.5 %
 * (expressed here as the fraction 0.235).
 * Source: CLP Regulation (EC) 1272/2008 Annex I 2.4.2.1 note to Table 2.4.1; ADR 2.2.2.1.5 (refers to ISO 10156).
 */
export const ISO_10156_OXIDISING_POWER_LIMIT = 0.235

/**
 * Transport toxicity limit: a gas or mixture with LC50 ≤ 5000 ml/m³ (ppm by volume) is toxic (Division 2.3).
 * Source: ADR 2.2.2.1.5 / UN Model Regulations 2.2.2.1(c).
 */
export const TOXIC_LC50_LIMIT_PPMV = 5000

/**
 * Limit of the ISO 10156 flammability sum Σ A'_i/Tci: a fuel + inert mixture whose sum exceeds 1 is flammable in air.
 * Source: ISO 10156:2017 calculation method (structure from memory, see DOMAIN §6.2; unverified).
 */
export const ISO_10156_FLAMMABILITY_LIMIT = 1
