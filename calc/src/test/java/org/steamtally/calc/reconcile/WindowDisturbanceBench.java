package org.steamtally.calc.reconcile;

import java.time.Duration;
import java.time.Instant;
import java.time.InstantSource;
import java.util.Optional;
import java.util.Random;
import org.steamtally.calc.alarm.AlarmEngine;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.alarm.AlarmStimulus;
import org.steamtally.calc.alarm.ReconciliationInput;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;

/**
 * False window alarms on a fault-free, steady plant when the stream of snapshots is disturbed as in
 * a daemon that falls behind, with and without the window rule ({@link WindowRule}, 90 %, and new
 * readings counted for n_eff). The regenerative example, window 50 s, window limits 4.5 / 1.85 / 4.0
 * (docs/DETECTION.md), 900 s per seed with the disturbance from second 100 to 700, seeds 1 to 3.
 * Disturbances: {@code stale} each sensor starts a 20-40 s stale span with probability 0.01 per
 * second; {@code held} each value repeats the one before with probability 0.6 (a reading carried
 * over, still good); {@code skips} each snapshot is lost with probability 0.5; {@code all} the three.
 * Prints one line per disturbance and rule; figures in docs/DETECTION.md.
 */
final class WindowDisturbanceBench {

    static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");

    private WindowDisturbanceBench() {
    }

    public static void main(String[] args) {
        UnitDescription unit = RegenerativeExample.unit();
        TruthModel truth = TruthModel.of(unit, RegenerativeExample.designPoint());
        AlarmSettings settings = DetectionBench.windowSettings(4.5, 1.85, 4.0);
        for (String scenario : new String[] {"clean", "stale", "held", "skips", "all"}) {
            for (boolean rule : new boolean[] {false, true}) {
                int suspects = 0, globals = 0, withheld = 0, evals = 0;
                double maxT = 0;
                long ns = 0;
                for (long seed = 1; seed <= 3; seed++) {
                    Simulator sim = Simulator.builder(truth).seed(seed).build();
                    Instant[] now = {T0};
                    InstantSource clock = () -> now[0];
                    AlarmEngine engine = new AlarmEngine(unit, settings, clock);
                    WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", unit, 50);
                    Random rnd = new Random(seed * 31);
                    int n = unit.sensors().size();
                    int[] staleUntil = new int[n];
                    double[] prev = null;
                    for (int s = 0; s < 900; s++) {
                        now[0] = T0.plusSeconds(s);
                        Snapshot snap = sim.step(now[0]).snapshot();
                        double[] v = snap.valuesSi().clone();
                        Snapshot.SensorStatus[] st = snap.status().clone();
                        boolean disturbed = s >= 100 && s < 700;
                        if (disturbed && (scenario.equals("stale") || scenario.equals("all"))) {
                            for (int i = 0; i < n; i++) {
                                if (staleUntil[i] <= s && rnd.nextDouble() < 0.01) {
                                    staleUntil[i] = s + 20 + rnd.nextInt(21);
                                }
                                if (staleUntil[i] > s) {
                                    st[i] = Snapshot.SensorStatus.STALE;
                                }
                            }
                        }
                        if (disturbed && prev != null && (scenario.equals("held") || scenario.equals("all"))) {
                            for (int i = 0; i < n; i++) {
                                if (rnd.nextDouble() < 0.6) {
                                    v[i] = prev[i];
                                }
                            }
                        }
                        prev = v;
                        if (disturbed && (scenario.equals("skips") || scenario.equals("all")) && rnd.nextDouble() < 0.5) {
                            continue;
                        }
                        Snapshot in = new Snapshot(snap.timestamp(), snap.unitId(), v, st);
                        long t0 = System.nanoTime();
                        java.util.List<AlarmEvent> ev;
                        if (rule) {
                            WindowVerdict verdict = w.evaluate(in, WindowRule.of(Duration.ofSeconds(1)));
                            if (verdict.isWithheld()) {
                                withheld++;
                                ev = engine.hold();
                            } else {
                                UnitResult r = verdict.result().get();
                                evals++;
                                ev = engine.evaluate(in, r, ReconciliationInput.from(r.reconciliation()));
                                for (var x : r.reconciliation().suspects()) maxT = Math.max(maxT, Math.abs(x.testValue()));
                            }
                        } else {
                            UnitResult r = w.evaluate(in);
                            evals++;
                            ev = engine.evaluate(in, r, ReconciliationInput.from(r.reconciliation()));
                            for (var x : r.reconciliation().suspects()) maxT = Math.max(maxT, Math.abs(x.testValue()));
                        }
                        ns += System.nanoTime() - t0;
                        for (AlarmEvent e : ev) {
                            if (e.stimulus() == AlarmStimulus.CONDITION_ACTIVE) {
                                if (e.kind() == AlarmKind.SUSPECT_SENSOR) suspects++;
                                if (e.kind() == AlarmKind.GLOBAL_TEST) globals++;
                            }
                        }
                    }
                }
                System.out.printf("%-6s rule=%-5s suspectRaises=%d globalRaises=%d withheld=%d evaluated=%d maxSuspectT=%.1f meanMs=%.2f%n",
                        scenario, rule, suspects, globals, withheld, evals, maxT, ns / 1e6 / Math.max(1, evals + withheld));
            }
        }
    }
}
