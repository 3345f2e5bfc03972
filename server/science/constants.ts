// Physical constants for the science modules: the one place they are written down. SI units; the unit is
// in each name. IAU 2015 Resolution B3 nominal solar and planetary values, CODATA 2018 for G and σ, as in
// astropy 5.2.1's astropy.constants (the reference fixture tests/fixtures/model/astropy-reference.json
// was made from it by tests/reference/make_model_reference.py).

/** Nominal solar radius R☉ (m). IAU 2015 Resolution B3. */
export const SOLAR_RADIUS_M = 6.957e8;

/** Nominal Earth equatorial radius R⊕ (m). IAU 2015 Resolution B3. */
export const EARTH_EQUATORIAL_RADIUS_M = 6.3781e6;

/** Nominal Jupiter equatorial radius R_J (m). IAU 2015 Resolution B3. */
export const JUPITER_EQUATORIAL_RADIUS_M = 7.1492e7;

/** Nominal solar mass parameter GM☉ (m³ s⁻²). IAU 2015 Resolution B3. */
export const SOLAR_MASS_PARAMETER_M3_PER_S2 = 1.3271244e20;

/** Nominal Earth mass parameter GM⊕ (m³ s⁻²). IAU 2015 Resolution B3. */
export const EARTH_MASS_PARAMETER_M3_PER_S2 = 3.986004e14;

/** Nominal Jupiter mass parameter GM_J (m³ s⁻²). IAU 2015 Resolution B3. */
export const JUPITER_MASS_PARAMETER_M3_PER_S2 = 1.2668653e17;

/** Newtonian constant of gravitation G (m³ kg⁻¹ s⁻²). CODATA 2018. */
export const GRAVITATIONAL_CONSTANT_M3_PER_KG_S2 = 6.6743e-11;

/** Solar mass M☉ (kg), derived as GM☉ / G. IAU 2015 Resolution B3 with CODATA 2018 G (as astropy does). */
export const SOLAR_MASS_KG = SOLAR_MASS_PARAMETER_M3_PER_S2 / GRAVITATIONAL_CONSTANT_M3_PER_KG_S2;

/** Astronomical unit (m), exact by definition. IAU 2012 Resolution B2. */
export const ASTRONOMICAL_UNIT_M = 149_597_870_700;

/** Nominal solar luminosity L☉ (W). IAU 2015 Resolution B3. */
export const SOLAR_LUMINOSITY_W = 3.828e26;

/** Nominal solar effective temperature T☉ (K). IAU 2015 Resolution B3. */
export const SOLAR_EFFECTIVE_TEMPERATURE_K = 5772;

/**
 * Stefan–Boltzmann constant σ (W m⁻² K⁻⁴). CODATA 2018: exact in the 2019 SI as 2π⁵k_B⁴/(15h³c²)
 * (published rounded as 5.670374419e-8); here to double precision, as astropy computes it.
 */
export const STEFAN_BOLTZMANN_W_PER_M2_K4 = 5.6703744191844314e-8;

/** Seconds in a day (s): the IAU day of exactly 86 400 SI seconds. */
export const SECONDS_PER_DAY = 86_400;

/** Hours in a day. */
export const HOURS_PER_DAY = 24;

/** Minutes in a day. */
export const MINUTES_PER_DAY = 1440;

/** Parts per million in one (relative flux → ppm). */
export const PPM_PER_UNIT = 1e6;

/** Mean solar density (kg m⁻³): M☉ / (4/3 π R☉³), from the nominal values above. */
export const SOLAR_MEAN_DENSITY_KG_PER_M3 = SOLAR_MASS_KG / ((4 / 3) * Math.PI * SOLAR_RADIUS_M ** 3);

/** kg m⁻³ per g cm⁻³. */
export const KG_PER_M3_PER_G_PER_CM3 = 1000;
