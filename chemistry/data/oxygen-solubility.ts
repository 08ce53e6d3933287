/**
 * Coefficients for dissolved-oxygen saturation and the density of (sea)water.
 *
 * - Benson & Krause (1984), Limnol. Oceanogr. 29:620–632, in the form printed by APHA Standard
 *   Methods 4500-O: ln C* (mg/L) = A0 + A1/T + A2/T² + A3/T³ + A4/T⁴ − S·(B0 + B1/T + B2/T²),
 *   T in K, S salinity in g/kg; water-saturated air at 1 atm total pressure.
 * - APHA / USGS pressure correction: water vapour pressure ln Pwv (atm) = V0 + V1/T + V2/T², and the
 *   second virial term θ = θ0 + θ1·t + θ2·t² (t in °C).
 * - Garcia & Gordon (1992), Limnol. Oceanogr. 37:1307–1312, "combined fit" of Benson & Krause data,
 *   µmol/kg, Ts = ln((298.15 − t)/(273.15 + t)); water-saturated air at 1 atm.
 * - One-atmosphere density of seawater, Millero & Poisson (1981), Deep-Sea Res. 28A:625–629, as
 *   adopted in UNESCO (1981/1983, Tech. Pap. Mar. Sci. 36 and 44); the pure-water part is Bigg (1967).
 *   Used only to convert Garcia–Gordon µmol/kg to a volume basis.
 */

export const BENSON_KRAUSE_APHA = {
	a: [-139.34411, 1.575701e5, -6.642308e7, 1.2438e10, -8.621949e11],
	b: [1.7674e-2, -10.754, 2140.7]
} as const;

export const APHA_PRESSURE_CORRECTION = {
	vapour: [11.8571, -3840.7, -216961],
	theta: [0.000975, -1.426e-5, 6.436e-8]
} as const;

export const GARCIA_GORDON_COMBINED = {
	a: [5.80818, 3.20684, 4.1189, 4.93845, 1.01567, 1.41575],
	b: [-7.01211e-3, -7.25958e-3, -7.93334e-3, -5.54491e-3],
	c0: -1.32412e-7
} as const;

export const SEAWATER_DENSITY_MILLERO_POISSON = {
	pureWater: [999.842594, 6.793952e-2, -9.09529e-3, 1.001685e-4, -1.120083e-6, 6.536332e-9],
	a: [8.24493e-1, -4.0899e-3, 7.6438e-5, -8.2467e-7, 5.3875e-9],
	b: [-5.72466e-3, 1.0227e-4, -1.6546e-6],
	c: 4.8314e-4
} as const;

/**
 * Mole fraction of O2 in dry air, 0.20946 (20.946 % by volume): the tabulated composition of dry air
 * (Glueckauf 1951, Compendium of Meteorology, as reprinted in the CRC Handbook; from memory) and the
 * value on which the Benson & Krause (1984) air-saturation fits rest (from memory). The U.S. Standard
 * Atmosphere 1962 lists 20.9476 % (checked; the 1976 edition the same, from memory), 2·10⁻⁵ higher,
 * far below the fits' own uncertainty. Use this constant wherever "air" means an O2 fraction.
 */
export const AIR_O2_MOLE_FRACTION = 0.20946;

/** Where AIR_O2_MOLE_FRACTION comes from, in words a reader of the API or a report can check. */
export const AIR_O2_MOLE_FRACTION_SOURCE =
	'composition of dry air, 20.946 % O2 by volume (Glueckauf 1951, as tabulated in the CRC Handbook; from memory), the basis of the Benson & Krause 1984 air-saturation values';

/** kPa per standard atmosphere (exact by definition). */
export const KPA_PER_ATM = 101.325;
