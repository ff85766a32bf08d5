package org.steamtally.calc.cycle;

import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * The computed state at one point of the cycle. An invalid state carries the reason and only the
 * values that could still be computed; absent values are empty, never NaN.
 *
 * <p>JSON (result record): {@code id, p_Pa, T_K, h_J_per_kg, s_J_per_kgK, v_m3_per_kg, x, phase,
 * saturation_margin_K, m_kg_per_s, valid, reason}.
 *
 * @param saturationMarginK superheat (positive, vapour) or subcooling (positive, liquid) in K:
 *                          the distance in temperature from the saturation line at the state's
 *                          pressure; 0 on the line; empty above the critical pressure
 * @param massFlowKgPerS    the mass flow of the stream, kg/s, measured or solved from the balances;
 *                          empty for an ideal reference state, which carries no flow, and when the
 *                          balances cannot give it
 */
public record StateResult(
        String id,
        OptionalDouble pressurePa,
        OptionalDouble temperatureK,
        OptionalDouble enthalpyJPerKg,
        OptionalDouble entropyJPerKgK,
        OptionalDouble specificVolumeM3PerKg,
        OptionalDouble quality,
        Optional<Phase> phase,
        OptionalDouble saturationMarginK,
        OptionalDouble massFlowKgPerS,
        boolean valid,
        Optional<String> reason) {

    public StateResult {
        Objects.requireNonNull(id, "id");
        if (valid == reason.isPresent()) {
            throw new IllegalArgumentException("state " + id + ": a reason is given exactly when the state is invalid");
        }
    }
}
