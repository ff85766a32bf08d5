package org.steamtally.dashboard.json;

import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.CycleResult;
import org.steamtally.calc.cycle.Phase;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.UnitResult;

/**
 * A hand-built result record of a fictional unit, {@code unit2} of site {@code northfield}: a
 * four-state cycle with one invalid state. The values are made up for the format and only roughly
 * plausible; the cycle figures are derived from the heat and work figures so that the record is
 * consistent with its own definitions (η = W_net / Q_in, heat rate = 3600 / η, bwr = W_pump / W_turbine).
 */
final class ResultFixture {

    static final double HEAT_ADDED_W = 2.9e8;
    static final double HEAT_REJECTED_W = 1.796e8;
    static final double TURBINE_WORK_W = 1.12e8;
    static final double PUMP_WORK_W = 1.6e6;
    static final double NET_WORK_W = TURBINE_WORK_W - PUMP_WORK_W;
    static final double THERMAL_EFFICIENCY = NET_WORK_W / HEAT_ADDED_W;

    private ResultFixture() {
    }

    static UnitResult unit2() {
        StateResult mainSteam = new StateResult("main_steam", of(14.2e6), of(808.15), of(3.4195e6), of(6.5421e3),
                of(0.023805), none(), Optional.of(Phase.VAPOUR), of(193.4), of(95.3), true, Optional.empty());
        StateResult exhaust = new StateResult("exhaust", of(8.1e3), of(314.66), of(2.2903e6), of(7.3205e3),
                of(16.11), of(0.8853), Optional.of(Phase.TWO_PHASE), of(0.0), of(95.3), true, Optional.empty());
        StateResult condensate = new StateResult("condensate", of(8.1e3), none(), none(), none(), none(), none(),
                Optional.empty(), none(), of(95.3), false, Optional.of("sensor TT-301 is stale"));
        StateResult feedwater = new StateResult("feedwater", of(15.1e6), of(316.2), of(1.8155e5), of(0.5859e3),
                of(0.0010028), none(), Optional.of(Phase.LIQUID), of(299.1), of(95.3), true, Optional.empty());

        ComponentResult boiler = new ComponentResult("boiler", "steam_generator", of(HEAT_ADDED_W), of(0.0),
                none(), of(1.32e8), true, Optional.empty());
        ComponentResult turbine = new ComponentResult("turbine", "turbine", of(0.0), of(TURBINE_WORK_W), of(0.87),
                of(1.21e7), true, Optional.empty());
        ComponentResult condenser = new ComponentResult("condenser", "condenser", none(), of(0.0), none(), none(),
                false, Optional.of("state condensate is invalid"));
        ComponentResult pump = new ComponentResult("feed_pump", "pump", of(0.0), of(-PUMP_WORK_W), of(0.8),
                of(2.9e5), true, Optional.empty());

        CycleResult cycle = new CycleResult(of(HEAT_ADDED_W), of(HEAT_REJECTED_W), of(TURBINE_WORK_W), of(PUMP_WORK_W),
                of(NET_WORK_W), of(THERMAL_EFFICIENCY), of(PUMP_WORK_W / TURBINE_WORK_W), of(3600.0 / THERMAL_EFFICIENCY),
                of(1.0 - 314.66 / 808.15), none());

        ClosureResult closure = new ClosureResult("cycle", 2.1e6, 3.4e6, 2.1e6 / 3.4e6);
        ClosureResult generator = new ClosureResult("turbine+generator", -0.9e6, 1.5e6, -0.9e6 / 1.5e6);

        return new UnitResult(Instant.parse("2026-12-01T06:30:00.250Z"), "northfield", "unit2",
                List.of(mainSteam, exhaust, condensate, feedwater), List.of(boiler, turbine, condenser, pump), cycle,
                List.of(closure, generator));
    }

    /** A record of the same unit in which nothing could be computed. */
    static UnitResult allEmpty() {
        StateResult state = new StateResult("main_steam", none(), none(), none(), none(), none(), none(),
                Optional.empty(), none(), none(), false, Optional.of("sensor PT-101 is missing"));
        ComponentResult component = new ComponentResult("turbine", "turbine", none(), none(), none(), none(), false,
                Optional.of("state main_steam is invalid"));
        CycleResult cycle = new CycleResult(none(), none(), none(), none(), none(), none(), none(), none(), none(),
                none());
        return new UnitResult(Instant.parse("2026-12-01T06:30:01Z"), "northfield", "unit2", List.of(state),
                List.of(component), cycle, List.of());
    }

    static OptionalDouble of(double value) {
        return OptionalDouble.of(value);
    }

    static OptionalDouble none() {
        return OptionalDouble.empty();
    }
}
