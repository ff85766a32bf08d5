package org.steamtally.calc.alarm;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;

import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.CycleResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

/**
 * The smallest unit an alarm engine can watch: one pressure sensor and the cycle closure, whose z
 * the test sets directly. Used where the test is about the alarm life cycle, not the plant.
 */
final class OneClosureUnit {

    static final String UNIT = "u1";
    static final String CLOSURE = "closure:cycle";
    static final double GOOD_PRESSURE_PA = 10e6;

    private OneClosureUnit() {
    }

    static UnitDescription unit() {
        Sensor p = new Sensor("PT-1", Quantity.PRESSURE, "MPa", 0.05e6, UncertaintyBasis.STANDARD, 0.0, 20e6,
                Duration.ofSeconds(10), Optional.empty());
        return new UnitDescription(UNIT, UNIT, List.of(p), List.of(), List.of(), DeadState.STANDARD);
    }

    static Snapshot snapshot(Instant t) {
        return Snapshot.allGood(t, UNIT, new double[] {GOOD_PRESSURE_PA});
    }

    static UnitResult result(Instant t, double z) {
        CycleResult empty = new CycleResult(OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(),
                OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(),
                OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty());
        double sigma = 1e6;
        return new UnitResult(t, "site", UNIT, List.of(), List.of(), empty,
                List.of(new ClosureResult("cycle", z * sigma, sigma, z)));
    }

    /** Settings whose closure alarm has no delays, so that one evaluation moves the condition. */
    static AlarmSettings immediate() {
        var kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.CLOSURE, AlarmSettings.CLOSURE_DEFAULT.withDelays(Duration.ZERO, Duration.ZERO));
        return new AlarmSettings(kinds, java.util.Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT);
    }

    /** Evaluates one snapshot whose cycle closure has the given z. */
    static List<AlarmEvent> feed(AlarmEngine engine, TestClock clock, double z) {
        return engine.evaluate(snapshot(clock.instant()), result(clock.instant(), z));
    }
}
