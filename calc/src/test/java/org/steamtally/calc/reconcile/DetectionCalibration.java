package org.steamtally.calc.reconcile;

import java.time.Instant;
import java.util.Locale;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;

/**
 * Fault-free run of the regenerative example through {@link WindowMeanEvaluator}: counts, for
 * candidate limits, the excursions that last at least the alarms' 10 s on-delay, of the largest
 * closure |z|, the global test's χ² over its quantile and the largest individual test value. An
 * excursion that long is what an alarm with that limit would raise (an upper bound: the alarm's
 * off-delay merges excursions close together). Used to choose the window's alarm limits in
 * docs/DETECTION.md:
 *
 * <pre>
 * java -cp calc/target/classes:calc/target/test-classes org.steamtally.calc.reconcile.DetectionCalibration \
 *     [window] [hours] [seed]
 * </pre>
 */
public final class DetectionCalibration {

    private DetectionCalibration() {
    }

    public static void main(String[] args) {
        int window = args.length > 0 ? Integer.parseInt(args[0]) : 50;
        double hours = args.length > 1 ? Double.parseDouble(args[1]) : 24.0;
        long seed = args.length > 2 ? Long.parseLong(args[2]) : 7L;
        var unit = RegenerativeExample.unit();
        Simulator sim = Simulator.builder(TruthModel.of(unit, RegenerativeExample.designPoint())).seed(seed).build();
        WindowMeanEvaluator evaluator = WindowMeanEvaluator.compile("fernholm", unit, window);
        int steps = (int) Math.round(hours * 3600);
        double[] z = new double[steps];
        double[] chi = new double[steps];
        double[] test = new double[steps];
        for (int s = 0; s < steps; s++) {
            Instant t = DetectionBench.T0.plusSeconds(s);
            UnitResult r = evaluator.evaluate(sim.step(t).snapshot());
            for (ClosureResult c : r.closure()) {
                z[s] = Math.max(z[s], Math.abs(c.z()));
            }
            ReconciliationResult rec = r.reconciliation();
            chi[s] = rec.chi2Limit().isPresent() ? rec.chi2() / rec.chi2Limit().getAsDouble() : 0.0;
            for (ReconciledSensor x : rec.sensors()) {
                if (x.testValue().isPresent()) {
                    test[s] = Math.max(test[s], x.testValue().getAsDouble());
                }
            }
        }
        int from = window; // the window is full from here
        System.out.printf(Locale.ROOT, "window %d, %.1f h, seed %d: excursions of at least 10 s per 24 h%n", window,
                hours, seed);
        report("max closure |z|", z, from, hours, new double[] {3.0, 3.5, 4.0, 4.5, 5.0, 5.5, 6.0});
        report("chi2 / quantile", chi, from, hours, new double[] {1.0, 1.25, 1.5, 1.75, 1.85, 2.0, 2.5, 3.0});
        report("max test value", test, from, hours, new double[] {1.96, 2.5, 3.0, 3.5, 4.0, 4.5, 5.0, 5.5});
    }

    private static void report(String name, double[] x, int from, double hours, double[] limits) {
        StringBuilder b = new StringBuilder(name + ":");
        double max = 0;
        for (int i = from; i < x.length; i++) {
            max = Math.max(max, x[i]);
        }
        for (double limit : limits) {
            int episodes = 0;
            int run = 0;
            for (int i = from; i < x.length; i++) {
                run = x[i] >= limit ? run + 1 : 0;
                if (run == 10) {
                    episodes++;
                }
            }
            b.append(String.format(Locale.ROOT, "  %.2f: %.1f", limit, episodes * 24.0 / hours));
        }
        System.out.println(b.append(String.format(Locale.ROOT, "  (max %.2f)", max)));
    }
}
