package org.steamtally.calc.cycle;

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

/**
 * One snapshot of the reheat-regenerative unit of {@link RegenerativeUnitFixture} (15 flowing
 * states, 4 ideal references, 33 sensors, 11 components) to its full result record: every state by
 * IF97, the flows from the heater balances, component heat, work, isentropic efficiency and exergy
 * destruction, the cycle's figures, and five closure residuals with their first-order
 * uncertainties. Target: at most 20 µs per snapshot, and nothing allocated beyond the result
 * record itself (check with {@code -prof gc}).
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class CycleEvaluationBenchmark {

    private CycleModel model;
    private Snapshot snapshot;

    @Setup
    public void setUp() {
        model = CycleModel.compile("site", RegenerativeUnitFixture.unit());
        snapshot = RegenerativeUnitFixture.snapshot();
        UnitResult result = model.evaluate(snapshot);
        // A benchmark of a failing evaluation would measure the wrong path.
        for (StateResult s : result.states()) {
            if (!s.valid()) {
                throw new IllegalStateException("state " + s.id() + " is invalid: " + s.reason().orElse(""));
            }
        }
        if (result.closure().size() != 5) {
            throw new IllegalStateException("expected five closures, got " + result.closure());
        }
    }

    @Benchmark
    public UnitResult evaluateSnapshot() {
        return model.evaluate(snapshot);
    }
}
