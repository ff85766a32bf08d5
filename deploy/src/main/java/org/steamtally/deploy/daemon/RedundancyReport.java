package org.steamtally.deploy.daemon;

import java.io.PrintWriter;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.TreeMap;
import org.steamtally.calc.cycle.ReconciledQuantity;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.reconcile.ReconcilingEvaluator;
import org.steamtally.calc.reconcile.Reliability;
import org.steamtally.calc.sim.DesignPoint;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.calc.sim.TruthPoint;

/**
 * Which sensors of a unit the reconciliation can check. The classification (VDI 2048: a measured
 * quantity is redundant when its adjustment is tested, just determined when it is not; an unmeasured
 * one observable or not) depends on the linearisation point, so the reconciler is run on one
 * snapshot: the unit's design point through the truth model when one is known (the shipped
 * examples), otherwise every sensor at the middle of its declared range. The latter is not a
 * consistent operating point, so only the classification is used from it, never the figures.
 */
public final class RedundancyReport {

    /** The report of one unit. */
    public record UnitReport(String unitId, String basis, String status, int redundancy, List<String> redundant,
                             List<String> justDetermined, List<String> excluded, List<String> observable,
                             List<String> notObservable, List<Reliability.SensorReliability> reliability) {

        /** Redundant sensors whose 3σ bias the window-mean test cannot find within a minute. */
        public List<String> notCheckableAtTarget() {
            return reliability.stream()
                    .filter(s -> redundant.contains(s.id()) && !s.checkedAtTargetWithinWindow())
                    .map(Reliability.SensorReliability::id).toList();
        }
    }

    private RedundancyReport() {
    }

    public static UnitReport of(PlantDescription plant, UnitDescription unit) {
        Optional<DesignPoint> design = ExampleDesignPoints.forUnit(plant.siteId(), unit.id());
        double[] values = new double[unit.sensors().size()];
        String basis;
        if (design.isPresent()) {
            TruthPoint truth = TruthModel.of(unit, design.get()).atDesign();
            for (int i = 0; i < values.length; i++) {
                values[i] = truth.valueSi(unit.sensors().get(i).id());
            }
            basis = "design point of the shipped example";
        } else {
            for (int i = 0; i < values.length; i++) {
                Sensor s = unit.sensors().get(i);
                values[i] = 0.5 * (s.rangeMinSi() + s.rangeMaxSi());
            }
            basis = "every sensor at the middle of its range (no design point known for this unit)";
        }
        UnitResult r = ReconcilingEvaluator.compile(plant.siteId(), unit)
                .evaluate(Snapshot.allGood(Instant.EPOCH, unit.id(), values));
        ReconciliationResult rec = r.reconciliation();
        List<String> redundant = new ArrayList<>();
        List<String> just = new ArrayList<>();
        List<String> excluded = new ArrayList<>();
        for (ReconciledSensor s : rec.sensors()) {
            switch (s.redundancy()) {
                case "redundant" -> redundant.add(s.id());
                case "just_determined" -> just.add(s.id());
                default -> excluded.add(s.id());
            }
        }
        List<String> observable = new ArrayList<>();
        List<String> notObservable = new ArrayList<>();
        for (ReconciledQuantity q : rec.unmeasured()) {
            (q.reconciled().isPresent() ? observable : notObservable).add(q.id());
        }
        return new UnitReport(unit.id(), basis, rec.status() + rec.reason().map(x -> " (" + x + ")").orElse(""),
                rec.redundancy(), redundant, just, excluded, observable, notObservable, reliability(unit, values));
    }

    private static List<Reliability.SensorReliability> reliability(UnitDescription unit, double[] values) {
        try {
            return Reliability.of(unit, values);
        } catch (RuntimeException e) {
            // the classification above stands on its own; the figures need a converged reconciliation
            return List.of();
        }
    }

    public static void print(UnitReport r, PrintWriter out) {
        out.println("unit " + r.unitId() + ": redundancy degree " + r.redundancy() + ", reconciliation "
                + r.status());
        out.println("  linearised at: " + r.basis());
        line(out, "redundant (checked)", r.redundant());
        line(out, "just determined (cannot be checked)", r.justDetermined());
        if (!r.excluded().isEmpty()) {
            line(out, "excluded", r.excluded());
        }
        line(out, "unmeasured, observable", r.observable());
        line(out, "unmeasured, not observable", r.notObservable());
        if (r.reliability().isEmpty()) {
            return;
        }
        out.printf(Locale.ROOT, "  redundancy number r and minimum detectable bias MDB = u d0 / sqrt(n r) in standard"
                + " uncertainties u (Baarda 1968; d0 %.2f for one snapshot, %.2f for a mean of %d):%n",
                Reliability.DELTA0_SNAPSHOT, Reliability.DELTA0_WINDOW, Reliability.WINDOW);
        for (Reliability.SensorReliability s : r.reliability()) {
            if (r.redundant().contains(s.id())) {
                out.printf(Locale.ROOT, "    %-24s r %.3f  MDB %s u per snapshot, %s u over %d snapshots%n", s.id(),
                        s.redundancyNumber(), sigmas(s.mdbSnapshotSigmas()), sigmas(s.mdbWindowSigmas()),
                        Reliability.WINDOW);
            }
        }
        List<String> weak = r.notCheckableAtTarget();
        if (weak.isEmpty()) {
            out.println("  every redundant sensor: a 3 u bias is found within one window ("
                    + Reliability.WINDOW + " snapshots)");
        } else {
            out.println("  cannot be checked at 3 u within one window (" + weak.size() + "): " + String.join(", ", weak));
            out.println("    the balances see too little of these; a second transmitter on each"
                    + " (same_measurand_as) makes the pair's difference checkable");
        }
    }

    private static String sigmas(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%.2f", v) : "inf";
    }

    private static void line(PrintWriter out, String label, List<String> ids) {
        out.println("  " + label + " (" + ids.size() + "): " + (ids.isEmpty() ? "-" : String.join(", ", ids)));
    }
}
