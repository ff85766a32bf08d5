package org.steamtally.calc.sim;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.RegenerativeUnitFixture;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.UnitDescription;

/**
 * One simulator step of the reheat-regenerative unit of {@link RegenerativeUnitFixture} (15 flowing
 * states, 33 sensors): at constant load, where the truth is reused and a step is noise and faults
 * only, and on a load ramp, where every step solves the truth anew (cone-law pressures, IF97 states,
 * the flow balances). One step stands for one second of plant time, so the inverse of the time per
 * step is the speed-up over real time.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class SimulatorBenchmark {

    private static final Instant T0 = Instant.parse("2026-12-02T00:00:00Z");

    private Simulator constant;
    private Simulator ramp;
    private Instant next;
    private long second;

    @Setup
    public void setUp() {
        DesignPoint.Builder design = DesignPoint.builder().flow("main_steam", 150.0).isentropicEfficiency("lp", 0.90);
        List<String> derived = List.of("m_main_steam", "T_cw_out", "P_gen", "P_condensate_pump", "P_feed_pump", "m_fuel");
        UnitDescription unit = RegenerativeUnitFixture.unit();
        double[] values = RegenerativeUnitFixture.values();
        var sensors = unit.sensors();
        for (int i = 0; i < sensors.size(); i++) {
            if (!derived.contains(sensors.get(i).id())) {
                design.value(sensors.get(i).id(), values[i]);
            }
        }
        TruthModel truth = TruthModel.of(unit, design.build());
        // A benchmark of a truth that does not close would measure the wrong thing.
        UnitResult check = CycleModel.compile("site", unit).evaluate(
                Snapshot.allGood(T0, unit.id(), truth.at(new OperatingConditions(0.5, 3.0)).sensorValuesSi()));
        for (ClosureResult c : check.closure()) {
            if (!(Math.abs(c.z()) < 1e-6)) {
                throw new IllegalStateException("truth does not close " + c.id() + ": z " + c.z());
            }
        }
        // cycle, generator, two motors, fuel; the cooling water fixes the exhaust
        if (check.closure().size() != 5) {
            throw new IllegalStateException("expected five closures, got " + check.closure());
        }
        constant = Simulator.builder(truth).seed(1).build();
        // A slow ramp: every step a new load, so every step solves the truth.
        ramp = Simulator.builder(truth).seed(1).load(new LoadProgram(1.0, List.of(
                new LoadProgram.Ramp(T0, Duration.ofDays(3650), 0.4)))).build();
        next = T0;
    }

    @Benchmark
    public SimulatedSample stepAtConstantLoad() {
        next = next.plusSeconds(1);
        return constant.step(next);
    }

    @Benchmark
    public SimulatedSample stepOnALoadRamp() {
        second++;
        return ramp.step(T0.plusSeconds(second));
    }
}
