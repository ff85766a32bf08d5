package org.steamtally.calc.cycle;

import java.util.OptionalDouble;

/**
 * The cycle's figures of merit. Heat and work as magnitudes, in W. Thermal efficiency is net work
 * over the heat added in the steam generator and reheater (not over net heat). Heat rate is
 * 3600 / η in kJ/kWh. Each is empty when the states it needs are invalid.
 *
 * <p>JSON (result record, object {@code cycle}): {@code heat_added_W, heat_rejected_W,
 * turbine_work_W, pump_work_W, net_work_W, thermal_efficiency, back_work_ratio,
 * heat_rate_kJ_per_kWh, carnot_efficiency, mean_temperature_carnot_efficiency}.
 *
 * @param carnotEfficiency                1 − T_min/T_max over the cycle's valid states
 * @param meanTemperatureCarnotEfficiency 1 − T̄_out/T̄_in with the thermodynamic mean temperatures of
 *                                        heat addition and rejection, T̄ = Q / ΔS
 */
public record CycleResult(
        OptionalDouble heatAddedW,
        OptionalDouble heatRejectedW,
        OptionalDouble turbineWorkW,
        OptionalDouble pumpWorkW,
        OptionalDouble netWorkW,
        OptionalDouble thermalEfficiency,
        OptionalDouble backWorkRatio,
        OptionalDouble heatRateKJPerKWh,
        OptionalDouble carnotEfficiency,
        OptionalDouble meanTemperatureCarnotEfficiency) {
}
