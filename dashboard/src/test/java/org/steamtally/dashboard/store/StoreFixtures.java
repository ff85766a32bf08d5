package org.steamtally.dashboard.store;

import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.CycleResult;
import org.steamtally.calc.cycle.MetricsBasis;
import org.steamtally.calc.cycle.Phase;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Suspect;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.UnitResult;

/**
 * Records of the fictional site {@code fernholm} for the store's tests. The figures are made up and
 * only roughly plausible; what matters is that every kind of field occurs: numbers, empty values,
 * phases, invalid entries with reasons, and text that needs escaping in line protocol.
 */
final class StoreFixtures {

    static final String SITE = "fernholm";
    static final String UNIT = "unit1";
    static final Instant T0 = Instant.parse("2026-11-30T06:00:00.250Z");

    private StoreFixtures() {
    }

    /** A full record at {@code ts} whose numbers vary with {@code k}. */
    static UnitResult record(Instant ts, int k) {
        return record(SITE, UNIT, ts, k);
    }

    static UnitResult record(String site, String unit, Instant ts, int k) {
        StateResult mainSteam = new StateResult("main_steam", of(16.5e6 + k), of(811.0), of(3.3975e6), of(6.3912e3),
                of(0.019987), none(), Optional.of(Phase.VAPOUR), of(197.3), of(150.0 + 0.01 * k), true,
                Optional.empty());
        StateResult exhaust = new StateResult("exhaust", of(7.0e3), of(312.0), of(2.33e6), of(7.46e3), of(18.1),
                of(0.9012), Optional.of(Phase.TWO_PHASE), of(0.0), of(112.4), true, Optional.empty());
        StateResult condensate = new StateResult("condensate", of(7.0e3), none(), none(), none(), none(), none(),
                Optional.empty(), none(), none(), false,
                Optional.of("sensor \"TT-301\" is stale, a=b\\c"));
        ComponentResult boiler = new ComponentResult("boiler", "steam_generator", of(3.0e8 + 1000.0 * k), of(0.0),
                none(), of(1.32e8), true, Optional.empty());
        ComponentResult pump = new ComponentResult("feed pump, 2", "pump", of(0.0), of(-1.6e6), of(0.8), of(2.9e5),
                true, Optional.empty());
        CycleResult cycle = new CycleResult(of(3.0e8), of(1.9e8), of(1.116e8), of(1.6e6), of(1.1e8),
                of(0.36 + 0.0001 * (k % 6)), of(1.6e6 / 1.116e8), of(3600.0 / (0.36 + 0.0001 * (k % 6))),
                of(0.6153), none());
        double z = (k % 6) - 2.5;
        ClosureResult closure = new ClosureResult("cycle", z * 1.0e6, 1.0e6, z);
        ClosureResult generator = new ClosureResult("hp_turbine+lp_turbine+generator", -0.9e6, 1.5e6, -0.6);
        return new UnitResult(ts, site, unit, List.of(mainSteam, exhaust, condensate), List.of(boiler, pump), cycle,
                List.of(closure, generator));
    }

    /** A record with only the cycle's heat added and net work, for energy sums. */
    static UnitResult cycleOnly(Instant ts, double heatAddedW, double netWorkW) {
        CycleResult cycle = new CycleResult(of(heatAddedW), none(), none(), none(), of(netWorkW),
                of(netWorkW / heatAddedW), none(), of(3600.0 * heatAddedW / netWorkW), none(), none());
        return new UnitResult(ts, SITE, UNIT, List.of(), List.of(), cycle, List.of());
    }

    /**
     * A full record whose reconciliation failed the global test and names {@code FT-101} as suspect;
     * {@code generator.efficiency} has no test value (not redundant).
     */
    static UnitResult reconciledRecord(Instant ts) {
        UnitResult r = record(ts, 1);
        ReconciliationResult rec = new ReconciliationResult(ReconciliationResult.FAILED, 18.2, of(11.07), 5, 0.95,
                1.959963984540054, 3, Optional.empty(), List.of(
                        new ReconciledSensor("FT-101", "sensor", "kg/s", of(150.9), of(0.75), of(149.8), of(0.4),
                                of(3.9), "redundant", true),
                        new ReconciledSensor("TT-202", "sensor", "K", of(811.3), of(0.5), of(811.0), of(0.3),
                                of(0.4), "redundant", false),
                        new ReconciledSensor("generator.efficiency", "constant", "1", of(0.985), of(0.002),
                                of(0.985), of(0.002), none(), "just_determined", false)),
                List.of(), List.of(new Suspect(1, "FT-101", "kg/s", List.of("FT-101"), 3.9, of(1.1), of(0.3), true)));
        return new UnitResult(r.timestamp(), r.site(), r.unit(), r.states(), r.components(), r.cycle(), r.closure(),
                rec, MetricsBasis.RAW, r.cycle());
    }

    /** {@link #reconciledRecord} with a failed window-channel verdict naming TT-311, then FT-101. */
    static UnitResult windowRecord(Instant ts) {
        return reconciledRecord(ts).withWindowReconciliation(new org.steamtally.calc.cycle.WindowReconciliation(
                50.0, 50, 50, ReconciliationResult.FAILED, 61.2, of(11.07), 5, List.of(
                        new Suspect(1, "TT-311", "K", List.of("TT-311"), 8.8, of(0.33), of(0.037), false),
                        new Suspect(2, "FT-101", "kg/s", List.of("FT-101"), 4.1, of(0.4), of(0.1), true))));
    }

    static StoredReconciliation reconciliation(Instant ts, boolean flowSuspect, double flowTest, boolean tempSuspect,
            double tempTest) {
        return new StoredReconciliation(ts, SITE, UNIT, 7.3, 11.07, 5, true, List.of(
                new StoredReconciliation.Sensor("FT-101", 150.2, 149.8, 0.4, flowTest, flowSuspect),
                new StoredReconciliation.Sensor("TT-202", 811.3, 811.0, 0.7, tempTest, tempSuspect)));
    }

    static StoredAlarmEvent alarm(Instant ts, String alarmId, String kind, String oldState, String newState,
            boolean active) {
        return new StoredAlarmEvent(ts, SITE, UNIT, alarmId, kind, "high", oldState, newState, active,
                OptionalDouble.of(3.1), OptionalDouble.of(2.0),
                kind.equals("transition") ? Optional.empty() : Optional.of("operator 'k'"),
                kind.equals("shelve") ? Optional.of("instrument \"FT-101\" under repair, 4 h") : Optional.empty());
    }

    static StoredReading reading(Instant ts, String sensor, double valueSi) {
        return new StoredReading(ts, SITE, UNIT, sensor, valueSi, "good");
    }

    static OptionalDouble of(double v) {
        return OptionalDouble.of(v);
    }

    static OptionalDouble none() {
        return OptionalDouble.empty();
    }
}
