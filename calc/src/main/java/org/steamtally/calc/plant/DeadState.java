package org.steamtally.calc.plant;

/**
 * The environment against which exergy is measured: specific flow exergy is
 * e = h − h0 − T0 (s − s0) with h0, s0 of liquid water at (T0, p0).
 *
 * @param temperatureK T0, K
 * @param pressurePa   p0, Pa
 */
public record DeadState(double temperatureK, double pressurePa) {

    /** 25 °C and one standard atmosphere, a common choice for exergy analyses (common practice). */
    public static final DeadState STANDARD = new DeadState(298.15, 101_325.0);

    public DeadState {
        if (!(temperatureK >= 273.16 && temperatureK <= 330.0)) {
            throw new IllegalArgumentException("dead-state temperature must lie within 273.16 K to 330 K, was "
                    + temperatureK + " K");
        }
        if (!(pressurePa >= 5e3 && pressurePa <= 2e5)) {
            throw new IllegalArgumentException("dead-state pressure must lie within 5 kPa to 200 kPa, was "
                    + pressurePa + " Pa");
        }
    }
}
