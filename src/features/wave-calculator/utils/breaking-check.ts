/**
 * Whether a regular wave of height H is steeper than linear theory can stand for: the limiting
 * steepness of Miche (1944), H/L <= 0.142*tanh(kd) (quoted from memory, as given in SPM 1984 Ch. 2),
 * which tends to 1/7 in deep water and to the depth limit H/d ≈ 0.89 (= 0.142·2π) in shallow water.
 *
 * @param heightM - H, m. @param wavelengthM - L, m. @param waveNumberRadPerM - k, rad/m.
 * @param depthM - d, m.
 * @returns the steepness H/L and its Miche limit (both dimensionless) and `breaking` when exceeded.
 */
export function breakingCheck(heightM: number, wavelengthM: number, waveNumberRadPerM: number, depthM: number) {
  const steepness = heightM / wavelengthM;
  const limit = 0.142 * Math.tanh(waveNumberRadPerM * depthM);
  return { steepness, limit, breaking: steepness > limit };
}
