package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.util.OptionalDouble;

/** Lookups and whole-record checks on a {@link UnitResult}. */
final class Results {

    private Results() {
    }

    static StateResult state(UnitResult r, String id) {
        return r.states().stream().filter(s -> s.id().equals(id)).findFirst()
                .orElseThrow(() -> new AssertionError("no state " + id));
    }

    static ComponentResult component(UnitResult r, String id) {
        return r.components().stream().filter(c -> c.id().equals(id)).findFirst()
                .orElseThrow(() -> new AssertionError("no component " + id));
    }

    static ClosureResult closure(UnitResult r, String id) {
        return r.closure().stream().filter(c -> c.id().equals(id)).findFirst()
                .orElseThrow(() -> new AssertionError("no closure " + id + " in " + r.closure()));
    }

    static boolean hasClosure(UnitResult r, String id) {
        return r.closure().stream().anyMatch(c -> c.id().equals(id));
    }

    /** Every number the result carries is finite: an absent value is empty, never NaN. */
    static void assertAllFinite(UnitResult r) {
        for (StateResult s : r.states()) {
            check(s.id(), s.pressurePa(), s.temperatureK(), s.enthalpyJPerKg(), s.entropyJPerKgK(),
                    s.specificVolumeM3PerKg(), s.quality(), s.saturationMarginK(), s.massFlowKgPerS());
        }
        for (ComponentResult c : r.components()) {
            check(c.id(), c.heatInW(), c.workOutW(), c.isentropicEfficiency(), c.exergyDestructionW());
        }
        CycleResult c = r.cycle();
        check("cycle", c.heatAddedW(), c.heatRejectedW(), c.turbineWorkW(), c.pumpWorkW(), c.netWorkW(),
                c.thermalEfficiency(), c.backWorkRatio(), c.heatRateKJPerKWh(), c.carnotEfficiency(),
                c.meanTemperatureCarnotEfficiency());
        for (ClosureResult cl : r.closure()) {
            assertTrue(Double.isFinite(cl.residualW()) && Double.isFinite(cl.sigmaW()) && Double.isFinite(cl.z()),
                    cl.toString());
        }
    }

    private static void check(String where, OptionalDouble... values) {
        for (OptionalDouble v : values) {
            if (v.isPresent() && !Double.isFinite(v.getAsDouble())) {
                fail(where + " carries a non-finite value " + v);
            }
        }
    }
}
