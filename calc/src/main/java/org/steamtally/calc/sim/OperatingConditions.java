package org.steamtally.calc.sim;

/**
 * The two things that move a unit away from its design point in the truth model.
 *
 * @param loadFraction            main flow over its design value; within (0, 1.1]. The truth is
 *                                checked from 0.3 to 1 (see docs/SIMULATOR.md)
 * @param coolingWaterInletShiftK cooling-water inlet temperature less its design value, K, within ±30 K
 */
public record OperatingConditions(double loadFraction, double coolingWaterInletShiftK) {

    /** Full load at the design cooling-water temperature. */
    public static final OperatingConditions DESIGN = new OperatingConditions(1.0, 0.0);

    public OperatingConditions {
        if (!(loadFraction > 0.0 && loadFraction <= 1.1)) {
            throw new IllegalArgumentException("load fraction must lie within 0 (exclusive) and 1.1, was " + loadFraction);
        }
        if (!(Math.abs(coolingWaterInletShiftK) <= 30.0)) {
            throw new IllegalArgumentException("cooling-water inlet shift must lie within -30 K and 30 K, was "
                    + coolingWaterInletShiftK + " K");
        }
    }
}
