package org.steamtally.dashboard.json;

import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.CycleResult;
import org.steamtally.calc.cycle.MetricsBasis;
import org.steamtally.calc.cycle.Phase;
import org.steamtally.calc.cycle.ReconciledQuantity;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.Suspect;
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

        CycleResult cycleRaw = new CycleResult(of(HEAT_ADDED_W), of(HEAT_REJECTED_W), of(TURBINE_WORK_W),
                of(PUMP_WORK_W), of(NET_WORK_W), of(THERMAL_EFFICIENCY), of(PUMP_WORK_W / TURBINE_WORK_W),
                of(3600.0 / THERMAL_EFFICIENCY), of(1.0 - 314.66 / 808.15), none());

        return new UnitResult(Instant.parse("2026-12-01T06:30:00.250Z"), "northfield", "unit2",
                List.of(mainSteam, exhaust, condensate, feedwater), List.of(boiler, turbine, condenser, pump), cycle,
                List.of(closure, generator), reconciliation(), MetricsBasis.RAW_EXCLUDING_SUSPECTS, cycleRaw);
    }

    /**
     * A failed global test whose one suspect, FT-101, cannot be told apart from JT-001. χ² limit
     * 7.815 for three degrees of freedom at 95 % (NIST/SEMATECH e-Handbook 1.3.6.7.4); the other
     * figures are made up.
     */
    static ReconciliationResult reconciliation() {
        List<ReconciledSensor> sensors = List.of(
                new ReconciledSensor("PT-101", "sensor", "Pa", of(14.2e6), of(0.05e6), of(14.2e6), of(0.05e6), none(),
                        "just_determined", false),
                new ReconciledSensor("TT-101", "sensor", "K", of(808.15), of(0.75), of(808.4), of(0.6), of(0.55),
                        "redundant", false),
                new ReconciledSensor("FT-101", "sensor", "kg/s", of(97.4), of(0.5), of(95.3), of(0.35), of(3.2),
                        "redundant", true),
                new ReconciledSensor("JT-001", "sensor", "W", of(1.1e8), of(0.15e6), of(1.1032e8), of(0.12e6), of(3.2),
                        "redundant", true),
                new ReconciledSensor("generator.efficiency", "constant", "1", of(0.985), of(0.002), of(0.9861), of(0.0019),
                        of(0.61), "redundant", false));
        List<ReconciledQuantity> unmeasured = List.of(
                new ReconciledQuantity("exhaust.h_J_per_kg", "J/kg", of(2.2903e6), of(9100.0), true),
                new ReconciledQuantity("condensate.m_kg_per_s", "kg/s", of(95.3), of(0.35), true));
        List<Suspect> suspects = List.of(new Suspect(1, "FT-101", "kg/s", List.of("FT-101", "JT-001"), 3.2, of(2.1),
                of(0.61), true));
        return new ReconciliationResult("failed", 12.3, of(7.815), 3, 0.95, 1.959963984540054, 4, Optional.empty(),
                sensors, unmeasured, suspects);
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
