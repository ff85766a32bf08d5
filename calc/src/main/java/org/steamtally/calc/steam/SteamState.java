package org.steamtally.calc.steam;

import java.util.Objects;
import java.util.OptionalDouble;

/**
 * One state of water or steam by IAPWS-IF97, in SI base units.
 *
 * <p>A two-phase state ({@link Region#REGION_4}) has a vapour quality and no isobaric or isochoric
 * heat capacity or speed of sound, which are not defined for a two-phase mixture; a single-phase
 * state has those three and no quality. The constructor enforces this, so an absent value can never
 * be mistaken for a number.
 *
 * @param pressurePa                   pressure p, Pa
 * @param temperatureK                 temperature T, K
 * @param enthalpyJPerKg               specific enthalpy h, J/kg
 * @param entropyJPerKgK               specific entropy s, J/(kg·K)
 * @param specificVolumeM3PerKg        specific volume v, m³/kg
 * @param internalEnergyJPerKg         specific internal energy u, J/kg
 * @param isobaricHeatCapacityJPerKgK  cp, J/(kg·K); empty in the two-phase region
 * @param isochoricHeatCapacityJPerKgK cv, J/(kg·K); empty in the two-phase region
 * @param speedOfSoundMPerS            w, m/s; empty in the two-phase region
 * @param quality                      vapour mass fraction x, 0 to 1; present only in the two-phase region
 * @param region                       the IF97 region the state was computed in
 */
public record SteamState(
        double pressurePa,
        double temperatureK,
        double enthalpyJPerKg,
        double entropyJPerKgK,
        double specificVolumeM3PerKg,
        double internalEnergyJPerKg,
        OptionalDouble isobaricHeatCapacityJPerKgK,
        OptionalDouble isochoricHeatCapacityJPerKgK,
        OptionalDouble speedOfSoundMPerS,
        OptionalDouble quality,
        Region region) {

    public SteamState {
        Objects.requireNonNull(region, "region");
        requireFinite("p", pressurePa);
        requireFinite("T", temperatureK);
        requireFinite("h", enthalpyJPerKg);
        requireFinite("s", entropyJPerKgK);
        requireFinite("v", specificVolumeM3PerKg);
        requireFinite("u", internalEnergyJPerKg);
        boolean twoPhase = region == Region.REGION_4;
        if (twoPhase != quality.isPresent()) {
            throw new IllegalArgumentException("quality must be given exactly for two-phase states, region " + region);
        }
        if (twoPhase == isobaricHeatCapacityJPerKgK.isPresent()
                || twoPhase == isochoricHeatCapacityJPerKgK.isPresent()
                || twoPhase == speedOfSoundMPerS.isPresent()) {
            throw new IllegalArgumentException("cp, cv and w must be given exactly for single-phase states, region " + region);
        }
    }

    /** A single-phase state in region 1, 2, 3 or 5. */
    public static SteamState singlePhase(double p, double T, double h, double s, double v, double u,
                                         double cp, double cv, double w, Region region) {
        return new SteamState(p, T, h, s, v, u, OptionalDouble.of(cp), OptionalDouble.of(cv),
                OptionalDouble.of(w), OptionalDouble.empty(), region);
    }

    /** A saturated or wet state on the saturation line, with vapour quality {@code x}. */
    public static SteamState twoPhase(double p, double T, double h, double s, double v, double u, double x) {
        return new SteamState(p, T, h, s, v, u, OptionalDouble.empty(), OptionalDouble.empty(),
                OptionalDouble.empty(), OptionalDouble.of(x), Region.REGION_4);
    }

    /** Density ρ = 1/v, kg/m³. */
    public double densityKgPerM3() {
        return 1.0 / specificVolumeM3PerKg;
    }

    private static void requireFinite(String symbol, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(symbol + " must be finite, was " + value);
        }
    }
}
