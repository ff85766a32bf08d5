package org.steamtally.calc.sim;

/**
 * The true thermodynamic state and flow of one flowing state of the cycle.
 *
 * @param id             the state's id
 * @param pressurePa     p, Pa
 * @param temperatureK   T, K (the saturation temperature for a wet state)
 * @param enthalpyJPerKg h, J/kg, IAPWS-IF97
 * @param massFlowKgPerS m, kg/s
 */
public record TruthState(String id, double pressurePa, double temperatureK, double enthalpyJPerKg,
                         double massFlowKgPerS) {
}
