package org.steamtally.calc.alarm;

import java.time.Instant;
import java.time.InstantSource;
import java.util.List;
import java.util.Optional;
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
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.RegenerativeUnitFixture;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;

/**
 * The alarm engine's work for one snapshot of the reheat-regenerative unit of
 * {@link RegenerativeUnitFixture} (33 sensors, 19 states, 11 components, 5 closures, a
 * reconciliation verdict with no suspects): 33 stale and 33 range checks, 30 validity checks, 5
 * closures and the global test, in the steady case where nothing changes state. The result
 * record is computed once in the set-up, so only the alarms are timed. Target: well under the
 * cycle model's 10 µs, so that the alarms add little to 100 units at 1 Hz, and no allocation beyond
 * the clock's instant (check with {@code -prof gc}). {@code baseline} reads the clock alone.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class AlarmEvaluationBenchmark {

    /** A clock one second on at each reading, as the daemon's snapshots come at 1 Hz. */
    private static final class SteppingClock implements InstantSource {
        private long epochSecond = RegenerativeUnitFixture.SNAPSHOT_TIME.getEpochSecond();

        @Override
        public Instant instant() {
            return Instant.ofEpochSecond(epochSecond++);
        }
    }

    private AlarmEngine engine;
    private Snapshot snapshot;
    private UnitResult result;
    private Optional<ReconciliationInput> reconciliation;
    private SteppingClock clock;

    @Setup
    public void setUp() {
        CycleModel model = CycleModel.compile("site", RegenerativeUnitFixture.unit());
        snapshot = RegenerativeUnitFixture.snapshot();
        result = model.evaluate(snapshot);
        reconciliation = Optional.of(new ReconciliationInput(8.0, 16.9, 9, List.of()));
        clock = new SteppingClock();
        engine = new AlarmEngine(RegenerativeUnitFixture.unit(), AlarmSettings.DEFAULTS, clock);
        List<AlarmEvent> first = engine.evaluate(snapshot, result, reconciliation);
        // A steady operating point: any event here would time the wrong path.
        if (!first.isEmpty() || engine.alarms().size() != 33 + 33 + 30 + 1 + 5) {
            throw new IllegalStateException("expected a quiet unit with 102 alarms, got " + first + " and "
                    + engine.alarms().size() + " alarms");
        }
    }

    @Benchmark
    public List<AlarmEvent> evaluateSteadySnapshot() {
        return engine.evaluate(snapshot, result, reconciliation);
    }

    @Benchmark
    public Instant baseline() {
        return clock.instant();
    }
}
