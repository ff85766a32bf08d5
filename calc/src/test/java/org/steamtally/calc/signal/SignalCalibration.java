package org.steamtally.calc.signal;

import java.time.Instant;
import java.time.InstantSource;
import java.util.Locale;

import org.steamtally.calc.alarm.AlarmEngine;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.alarm.AlarmStimulus;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;

/**
 * False alarms of the signal check alone on the fault-free simulated regenerative example, over
 * many days: the simulator, the check and the alarm engine's frozen and erratic alarms, no
 * reconciliation, so a simulated day takes seconds. Reports the alarms raised, the share of
 * (snapshot, sensor) pairs at or above the scatter limit (to compare with the design probability)
 * and at 0.8 and 0.9 of it, and the largest ratio seen. See docs/DETECTION.md; run with
 *
 * <pre>
 * java -cp calc/target/classes:calc/target/test-classes org.steamtally.calc.signal.SignalCalibration [days] [seed] [window] [probability]
 * </pre>
 */
public final class SignalCalibration {

    private SignalCalibration() {
    }

    private static final class StepClock implements InstantSource {
        Instant now = Instant.parse("2026-12-02T06:00:00Z");

        @Override
        public Instant instant() {
            return now;
        }
    }

    public static void main(String[] args) {
        double days = args.length > 0 ? Double.parseDouble(args[0]) : 10.0;
        long seed = args.length > 1 ? Long.parseLong(args[1]) : 20261202L;
        int window = args.length > 2 ? Integer.parseInt(args[2]) : SignalSettings.WINDOW_DEFAULT;
        UnitDescription unit = RegenerativeExample.unit();
        TruthModel truth = TruthModel.of(unit, RegenerativeExample.designPoint());
        Simulator sim = Simulator.builder(truth).seed(seed).build();
        double p = args.length > 3 ? Double.parseDouble(args[3]) : SignalSettings.FALSE_ALARM_PROBABILITY_DEFAULT;
        SignalSettings d = SignalSettings.DEFAULTS.withWindow(window);
        SignalSettings settings = new SignalSettings(d.windowReadings(), d.warmUpReadings(), d.learningReadings(), p,
                d.declaredNoiseSi(), d.resolutionSi());
        StepClock clock = new StepClock();
        Instant t0 = clock.now;
        AlarmEngine engine = new AlarmEngine(unit, AlarmSettings.DEFAULTS, clock);
        SignalCheck check = AlarmEngine.signalCheck(unit, AlarmSettings.DEFAULTS, settings);
        long steps = Math.round(days * 86400.0);
        long decided = 0;
        long at100 = 0;
        long at90 = 0;
        long at80 = 0;
        double max = 0.0;
        String maxAt = "";
        int frozen = 0;
        int erratic = 0;
        long began = System.nanoTime();
        for (long s = 0; s < steps; s++) {
            clock.now = t0.plusSeconds(s);
            SignalReport report = check.check(sim.step(clock.now).snapshot());
            for (SensorSignal x : report.sensors()) {
                if (x.scatter() == SignalVerdict.NOT_DECIDED) {
                    continue;
                }
                decided++;
                double q = x.scatterRatio() / x.scatterLimit();
                at100 += q >= 1.0 ? 1 : 0;
                at90 += q >= 0.9 ? 1 : 0;
                at80 += q >= 0.8 ? 1 : 0;
                if (x.scatterRatio() > max) {
                    max = x.scatterRatio();
                    maxAt = x.sensorId() + " at " + clock.now;
                }
            }
            for (AlarmEvent e : engine.evaluateSignals(report)) {
                if (e.stimulus() == AlarmStimulus.CONDITION_ACTIVE) {
                    System.out.println("false alarm at " + e.time() + ": " + e.text());
                    if (e.kind() == AlarmKind.FROZEN_SENSOR) {
                        frozen++;
                    } else {
                        erratic++;
                    }
                }
            }
        }
        System.out.printf(Locale.ROOT, "window %d, limit %.3f, %d sensors, %.1f days, seed %d%n", window,
                settings.scatterQuantile(), unit.sensors().size(), days, seed);
        System.out.printf(Locale.ROOT, "decided (snapshot, sensor) pairs %d; at or above the limit %d (%.2e, design %.0e),"
                        + " 0.9 of it %d (%.2e), 0.8 of it %d (%.2e); largest ratio %.3f (%s)%n", decided, at100,
                (double) at100 / decided, settings.falseAlarmProbability(), at90, (double) at90 / decided, at80,
                (double) at80 / decided, max, maxAt);
        System.out.printf(Locale.ROOT, "alarms raised: frozen %d, erratic %d, per 24 h %.2f; wall time %.0f s%n", frozen,
                erratic, (frozen + erratic) / days, (System.nanoTime() - began) / 1e9);
    }
}
