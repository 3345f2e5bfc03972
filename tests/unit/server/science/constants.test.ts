import { describe, expect, it } from 'vitest';
import {
  ASTRONOMICAL_UNIT_M,
  EARTH_EQUATORIAL_RADIUS_M,
  EARTH_MASS_PARAMETER_M3_PER_S2,
  GRAVITATIONAL_CONSTANT_M3_PER_KG_S2,
  JUPITER_EQUATORIAL_RADIUS_M,
  JUPITER_MASS_PARAMETER_M3_PER_S2,
  SOLAR_LUMINOSITY_W,
  SOLAR_MASS_KG,
  SOLAR_MASS_PARAMETER_M3_PER_S2,
  SOLAR_MEAN_DENSITY_KG_PER_M3,
  SOLAR_RADIUS_M,
  STEFAN_BOLTZMANN_W_PER_M2_K4,
} from '../../../../server/science/constants';
// Written by tests/reference/make_model_reference.py from astropy 5.2.1 astropy.constants
// (IAU 2015 nominal values, CODATA 2018).
import reference from '../../../fixtures/model/astropy-reference.json';

const astropy = reference.constants;

describe('physical constants', () => {
  it('equal astropy 5.2.1 astropy.constants (IAU 2015 nominal values) for radii and mass parameters', () => {
    expect(SOLAR_RADIUS_M).toBe(astropy.R_sun_m);
    expect(EARTH_EQUATORIAL_RADIUS_M).toBe(astropy.R_earth_m);
    expect(JUPITER_EQUATORIAL_RADIUS_M).toBe(astropy.R_jup_m);
    expect(SOLAR_MASS_PARAMETER_M3_PER_S2).toBe(astropy.GM_sun_m3_s2);
    expect(EARTH_MASS_PARAMETER_M3_PER_S2).toBe(astropy.GM_earth_m3_s2);
    expect(JUPITER_MASS_PARAMETER_M3_PER_S2).toBe(astropy.GM_jup_m3_s2);
    expect(SOLAR_LUMINOSITY_W).toBe(astropy.L_sun_w);
  });

  it('equal astropy 5.2.1 astropy.constants (CODATA 2018) for G and σ, and its au (IAU 2012 B2)', () => {
    expect(GRAVITATIONAL_CONSTANT_M3_PER_KG_S2).toBe(astropy.G_si);
    expect(Math.abs(STEFAN_BOLTZMANN_W_PER_M2_K4 / astropy.sigma_sb_si - 1)).toBeLessThan(1e-15);
    expect(ASTRONOMICAL_UNIT_M).toBe(astropy.au_m);
  });

  it('derive the solar mass from GM☉/G as astropy 5.2.1 does (M_sun = 1.98841e30 kg)', () => {
    expect(Math.abs(SOLAR_MASS_KG / astropy.M_sun_kg - 1)).toBeLessThan(1e-15);
  });

  it('give a mean solar density of 1.41 g cm⁻³ (textbook value, from memory)', () => {
    expect(SOLAR_MEAN_DENSITY_KG_PER_M3 / 1000).toBeCloseTo(1.41, 2);
  });
});
