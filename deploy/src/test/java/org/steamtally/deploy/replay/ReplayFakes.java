package org.steamtally.deploy.replay;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.cycle.CycleResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Stand-ins for the plant loader, the unit conversion and the cycle evaluation, so that the replay
 * command can be tested for its own work: lines, topics, alignment, output and reporting.
 */
final class ReplayFakes {

    static final String SITE = "northfield";

    private ReplayFakes() {
    }

    /** A fictional unit with a pressure (MPa, 5 s max age) and a temperature (K, 5 s), each on its own topic. */
    static UnitDescription unit(String id) {
        return new UnitDescription(id, "Unit " + id, List.of(
                new Sensor("PT-101", Quantity.PRESSURE, "MPa", 0.02e6, UncertaintyBasis.STANDARD, 0.0, 30e6,
                        Duration.ofSeconds(5), Optional.of(SITE + "/" + id + "/PT-101")),
                new Sensor("TT-101", Quantity.TEMPERATURE, "K", 0.5, UncertaintyBasis.STANDARD, 273.15, 900.0,
                        Duration.ofSeconds(5), Optional.of(SITE + "/" + id + "/TT-101"))),
                List.of(), List.of(), DeadState.STANDARD);
    }

    static PlantDescription plant(String... unitIds) {
        List<UnitDescription> units = new ArrayList<>();
        for (String id : unitIds) {
            units.add(unit(id));
        }
        return new PlantDescription(SITE, "Northfield", 101_325.0, units);
    }

    /** SI units pass unchanged, MPa is scaled; anything else is unknown. */
    static double toSi(Quantity quantity, String unit, double value, double atmosphericPa) {
        if (unit.equals(quantity.siUnit())) {
            return value;
        }
        if (quantity == Quantity.PRESSURE && unit.equals("MPa")) {
            return value * 1e6;
        }
        throw new IllegalArgumentException("not a known unit of " + quantity.name().toLowerCase());
    }

    /**
     * One state, valid exactly when every sensor of the snapshot is good, carrying the snapshot's
     * pressure so that a test can see which reading entered which snapshot.
     */
    static UnitEvaluator evaluator(String siteId, UnitDescription unit) {
        return snapshot -> {
            boolean allGood = true;
            for (Snapshot.SensorStatus s : snapshot.status()) {
                allGood &= s == Snapshot.SensorStatus.GOOD;
            }
            OptionalDouble p = snapshot.status()[0] == Snapshot.SensorStatus.GOOD
                    ? OptionalDouble.of(snapshot.valuesSi()[0]) : OptionalDouble.empty();
            StateResult state = new StateResult("main_steam", p, OptionalDouble.empty(), OptionalDouble.empty(),
                    OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(), Optional.empty(),
                    OptionalDouble.empty(), OptionalDouble.empty(), allGood, allGood ? Optional.empty() : Optional.of("a sensor is not good"));
            CycleResult cycle = new CycleResult(OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(),
                    OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(),
                    OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty());
            return new UnitResult(snapshot.timestamp(), siteId, unit.id(), List.of(state), List.of(), cycle, List.of());
        };
    }

    static ReplaySeams seams(PlantDescription plant) {
        return new ReplaySeams(path -> plant, ReplayFakes::toSi, ReplayFakes::evaluator);
    }
}
