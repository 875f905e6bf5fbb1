/**
 * Physical constants used by the DLS physics.
 * Source: The International System of Units (SI Brochure), 9th edition, BIPM 2019, Table 1:
 * the Boltzmann constant is exact by definition since 20 May 2019.
 */

/** Boltzmann constant k_B, J/K (exact; SI Brochure 9th ed., 2019). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;

/** Offset between the Celsius and Kelvin scales, K (exact; SI Brochure 9th ed., 2019, §2.3.1). */
export const ZERO_CELSIUS_K = 273.15;

/**
 * Converts a Celsius temperature to kelvin: T/K = t/°C + 273.15 (SI Brochure 9th ed., 2019).
 * @param celsius temperature, °C
 * @returns thermodynamic temperature, K
 */
export function celsiusToKelvin(celsius: number): number {
  return celsius + ZERO_CELSIUS_K;
}
