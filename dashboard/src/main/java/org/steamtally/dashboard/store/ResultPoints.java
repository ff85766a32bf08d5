package org.steamtally.dashboard.store;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.CycleResult;
import org.steamtally.calc.cycle.Phase;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.Suspect;
import org.steamtally.calc.cycle.UnitResult;

/**
 * Records to points and back: the one place that knows which record field goes to which field of
 * the schema ({@link Measurement}). Timestamps are cut to the millisecond, as in the result record.
 */
public final class ResultPoints {

    private ResultPoints() {
    }

    /**
     * The points of one result record: one per state, one per component, one for the cycle (left out
     * when every cycle figure is empty, since such a point would carry nothing), one per closure and
     * one for the window channel's verdict when the record has one.
     */
    public static List<Point> of(UnitResult r) {
        long ts = r.timestamp().toEpochMilli();
        List<Point> out = new ArrayList<>(r.states().size() + r.components().size() + 1 + r.closure().size());
        for (StateResult s : r.states()) {
            out.add(new Point(Measurement.STATES, r.site(), r.unit(), s.id(), ts,
                    d(s.pressurePa()), d(s.temperatureK()), d(s.enthalpyJPerKg()), d(s.entropyJPerKgK()),
                    d(s.specificVolumeM3PerKg()), d(s.quality()), s.phase().map(Phase::label).orElse(null),
                    d(s.saturationMarginK()), d(s.massFlowKgPerS()), s.valid(), s.reason().orElse(null)));
        }
        for (ComponentResult c : r.components()) {
            out.add(new Point(Measurement.COMPONENTS, r.site(), r.unit(), c.id(), ts,
                    c.type(), d(c.heatInW()), d(c.workOutW()), d(c.isentropicEfficiency()),
                    d(c.exergyDestructionW()), c.valid(), c.reason().orElse(null)));
        }
        CycleResult c = r.cycle();
        Point cycle = new Point(Measurement.CYCLE, r.site(), r.unit(), null, ts,
                d(c.heatAddedW()), d(c.heatRejectedW()), d(c.turbineWorkW()), d(c.pumpWorkW()), d(c.netWorkW()),
                d(c.thermalEfficiency()), d(c.backWorkRatio()), d(c.heatRateKJPerKWh()), d(c.carnotEfficiency()),
                d(c.meanTemperatureCarnotEfficiency()));
        if (!cycle.isEmpty()) {
            out.add(cycle);
        }
        for (ClosureResult k : r.closure()) {
            out.add(new Point(Measurement.CLOSURE, r.site(), r.unit(), k.id(), ts, k.residualW(), k.sigmaW(), k.z()));
        }
        r.windowReconciliation().ifPresent(w -> out.add(new Point(Measurement.WINDOW_RECONCILIATION, r.site(),
                r.unit(), null, ts, w.lengthS(), (long) w.samples(), w.status(), w.passed(), w.chi2(),
                d(w.chi2Limit()), d(w.chi2Ratio()), (long) w.redundancy(),
                w.suspects().isEmpty() ? null : String.join(",", w.suspects().stream().map(Suspect::id).toList()))));
        return out;
    }

    /** The whole-unit point (empty id) and one point per sensor. */
    public static List<Point> of(StoredReconciliation r) {
        long ts = r.timestamp().toEpochMilli();
        List<Point> out = new ArrayList<>(1 + r.sensors().size());
        out.add(new Point(Measurement.RECONCILIATION, r.site(), r.unit(), null, ts,
                r.chi2(), r.chi2Limit(), r.redundancy(), r.passed(), null, null, null, null, null));
        for (StoredReconciliation.Sensor s : r.sensors()) {
            out.add(new Point(Measurement.RECONCILIATION, r.site(), r.unit(), s.id(), ts,
                    null, null, null, null, s.measured(), s.reconciled(), s.sigmaReconciled(), s.testValue(),
                    s.suspect()));
        }
        return out;
    }

    /** The point of one alarm event. */
    public static Point of(StoredAlarmEvent e) {
        return new Point(Measurement.ALARMS, e.site(), e.unit(), e.alarmId(), e.timestamp().toEpochMilli(),
                e.kind(), e.priority(), e.oldState(), e.newState(), e.active(), d(e.value()), d(e.limit()),
                e.user().orElse(null), e.note().orElse(null));
    }

    /** The point of one reading. */
    public static Point of(StoredReading r) {
        return new Point(Measurement.READINGS, r.site(), r.unit(), r.sensorId(), r.timestamp().toEpochMilli(),
                r.valueSi(), r.quality());
    }

    /**
     * The alarm event a point of measurement {@code alarms} stores.
     *
     * @throws IllegalArgumentException when a required field is missing
     */
    public static StoredAlarmEvent alarmEvent(Point p) {
        if (p.measurement() != Measurement.ALARMS) {
            throw new IllegalArgumentException("not an alarm point: " + p);
        }
        return new StoredAlarmEvent(Instant.ofEpochMilli(p.timestampMs()), p.site(), p.unit(), p.id(),
                required(p, "kind"), required(p, "priority"), required(p, "old_state"), required(p, "new_state"),
                Boolean.TRUE.equals(p.value("active")), od(p.value("value")), od(p.value("limit")),
                Optional.ofNullable((String) p.value("user")), Optional.ofNullable((String) p.value("note")));
    }

    private static String required(Point p, String field) {
        Object v = p.value(field);
        if (!(v instanceof String s)) {
            throw new IllegalArgumentException("alarm point lacks its " + field + ": " + p);
        }
        return s;
    }

    private static Double d(OptionalDouble v) {
        return v.isPresent() ? v.getAsDouble() : null;
    }

    private static OptionalDouble od(Object v) {
        return v == null ? OptionalDouble.empty() : OptionalDouble.of((Double) v);
    }
}
