package org.steamtally.calc.steam;

/**
 * Constants of IAPWS-IF97 shared by all regions (IAPWS R7-97(2012), eq. 1 and 2), in SI units.
 */
public final class If97Constants {

    /** Specific gas constant of ordinary water R = 0.461526 kJ/(kg·K), in J/(kg·K); R7-97(2012), eq. 1. */
    public static final double R = 461.526;

    /** Critical temperature Tc = 647.096 K; R7-97(2012), eq. 2. */
    public static final double CRITICAL_TEMPERATURE_K = 647.096;

    /** Critical pressure pc = 22.064 MPa, in Pa; R7-97(2012), eq. 2. */
    public static final double CRITICAL_PRESSURE_PA = 22.064e6;

    /** Critical density ρc = 322 kg/m³; R7-97(2012), eq. 2. */
    public static final double CRITICAL_DENSITY_KG_PER_M3 = 322.0;

    private If97Constants() {
    }
}
