package org.steamtally.dashboard.store;

import java.time.Duration;
import java.util.List;
import java.util.Objects;
import java.util.OptionalDouble;

/**
 * What a shift review needs of one unit and one shift (or the part of it that has passed).
 *
 * @param until             end of the summarised part: the shift's end, or now for the running shift
 * @param energyInMWh       heat added to the working fluid, MWh (1 MWh = 3.6e9 J)
 * @param energyOutMWh      net work of the cycle, MWh
 * @param meanEfficiency    mean of the thermal-efficiency samples, dimensionless
 * @param worstEfficiency   smallest thermal-efficiency sample
 * @param meanHeatRateKJPerKWh  mean of the heat-rate samples, kJ/kWh
 * @param worstHeatRateKJPerKWh largest heat-rate sample, kJ/kWh
 * @param covered           time with data: the one-minute intervals that hold at least one cycle sample
 * @param closures          statistics of each first-law check
 * @param alarmsActive      time during which at least one alarm of the unit was active
 * @param topSuspects       the sensors reconciliation flagged most often, at most {@link #TOP_SUSPECTS}
 */
public record ShiftSummary(
        String site,
        String unit,
        Shift shift,
        java.time.Instant until,
        double energyInMWh,
        double energyOutMWh,
        OptionalDouble meanEfficiency,
        OptionalDouble worstEfficiency,
        OptionalDouble meanHeatRateKJPerKWh,
        OptionalDouble worstHeatRateKJPerKWh,
        Duration covered,
        List<ClosureStats> closures,
        Duration alarmsActive,
        List<SuspectSensor> topSuspects) {

    /** How many suspect sensors a summary names. */
    public static final int TOP_SUSPECTS = 5;

    public ShiftSummary {
        Objects.requireNonNull(site, "site");
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(shift, "shift");
        Objects.requireNonNull(until, "until");
        Objects.requireNonNull(covered, "covered");
        Objects.requireNonNull(alarmsActive, "alarmsActive");
        closures = List.copyOf(closures);
        topSuspects = List.copyOf(topSuspects);
    }

    /** Net work over heat added for the shift, E_out / E_in; empty without heat added. */
    public OptionalDouble efficiencyFromEnergy() {
        return energyInMWh > 0.0 ? OptionalDouble.of(energyOutMWh / energyInMWh) : OptionalDouble.empty();
    }
}
