package org.steamtally.dashboard.json;

import com.fasterxml.jackson.core.io.NumberOutput;
import java.io.Closeable;
import java.io.Flushable;
import java.io.IOException;
import java.io.Writer;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.Phase;
import org.steamtally.calc.cycle.ReconciledQuantity;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.Suspect;
import org.steamtally.calc.cycle.UnitResult;

/**
 * Writes result records of one unit as flat CSV (RFC 4180, {@code \n} line ends), one row per
 * snapshot: {@code ts, site, unit}, the {@code cycle.*} fields, {@code metrics_basis}, the
 * {@code cycle_raw.*} fields, the {@code reconciliation.*} summary, for each reconciled sensor
 * {@code reconciliation.sensor.<id>.<field>}, for each unmeasured quantity
 * {@code reconciliation.unmeasured.<id>.<field>}, {@code suspects} (the named suspects' ids in rank
 * order, space-separated), then for each state
 * {@code state.<id>.<field>}, for each component {@code component.<id>.<field>} and for each closure
 * {@code closure.<id>.<field>}, with the field names of the JSON form ({@link ResultFields}). A
 * component's {@code type} is left out: it is fixed by the plant description.
 *
 * <p>The columns are those of the first record written, which also writes the header. A later record
 * may lack a state, component or closure of the header (its cells stay empty) but may not bring one
 * the header lacks. Empty values are empty cells; numbers are shortest round-trip decimals.
 */
public final class ResultCsvWriter implements Closeable, Flushable {

    private static final List<String> RECONCILIATION_COLUMNS = List.of(ResultFields.STATUS, ResultFields.PASSED,
            ResultFields.CHI2, ResultFields.CHI2_LIMIT, ResultFields.REDUNDANCY, ResultFields.ITERATIONS);
    private static final List<String> SENSOR_COLUMNS = List.of("measured", "reconciled", "sigma_reconciled",
            "test_value", ResultFields.REDUNDANCY, ResultFields.SUSPECT);

    /** Selects jackson-core's Schubfach writer instead of {@code Double.toString}. */
    private static final boolean SHORTEST_DOUBLES = true;

    private final Writer out;
    private List<String> header;
    private Map<String, Integer> index;

    /** @param out where the rows go; closed by {@link #close()} */
    public ResultCsvWriter(Writer out) {
        this.out = Objects.requireNonNull(out, "out");
    }

    /** The columns a record gives, in the order written. */
    public static List<String> columns(UnitResult result) {
        List<String> names = new ArrayList<>(List.of(ResultFields.TS, ResultFields.SITE, ResultFields.UNIT));
        for (String f : ResultFields.CYCLE_NUMBERS) {
            names.add(ResultFields.CYCLE + "." + f);
        }
        names.add(ResultFields.METRICS_BASIS);
        for (String f : ResultFields.CYCLE_NUMBERS) {
            names.add(ResultFields.CYCLE_RAW + "." + f);
        }
        for (String f : RECONCILIATION_COLUMNS) {
            names.add(ResultFields.RECONCILIATION + "." + f);
        }
        for (ReconciledSensor s : result.reconciliation().sensors()) {
            String prefix = ResultFields.RECONCILIATION + ".sensor." + s.id() + ".";
            for (String f : SENSOR_COLUMNS) {
                names.add(prefix + f);
            }
        }
        for (ReconciledQuantity q : result.reconciliation().unmeasured()) {
            for (String f : ResultFields.UNMEASURED_NUMBERS) {
                names.add(ResultFields.RECONCILIATION + ".unmeasured." + q.id() + "." + f);
            }
        }
        names.add(ResultFields.SUSPECTS);
        for (StateResult s : result.states()) {
            String prefix = "state." + s.id() + ".";
            for (String f : ResultFields.STATE_NUMBERS) {
                names.add(prefix + f);
            }
            names.add(prefix + ResultFields.PHASE);
            names.add(prefix + ResultFields.SATURATION_MARGIN);
            names.add(prefix + ResultFields.MASS_FLOW);
            names.add(prefix + ResultFields.VALID);
            names.add(prefix + ResultFields.REASON);
        }
        for (ComponentResult c : result.components()) {
            String prefix = "component." + c.id() + ".";
            for (String f : ResultFields.COMPONENT_NUMBERS) {
                names.add(prefix + f);
            }
            names.add(prefix + ResultFields.VALID);
            names.add(prefix + ResultFields.REASON);
        }
        for (ClosureResult c : result.closure()) {
            for (String f : ResultFields.CLOSURE_NUMBERS) {
                names.add("closure." + c.id() + "." + f);
            }
        }
        return List.copyOf(names);
    }

    /** The header, once the first record has been written. */
    public Optional<List<String>> header() {
        return Optional.ofNullable(header);
    }

    /**
     * Writes one row, and the header before the first.
     *
     * @throws IllegalArgumentException if the record has a column the header lacks, or a present value
     *                                  is NaN or infinite; nothing is written then
     */
    public void write(UnitResult result) throws IOException {
        boolean first = header == null;
        List<String> own = columns(result);
        if (first) {
            header = own;
            index = new HashMap<>();
            for (int i = 0; i < own.size(); i++) {
                index.put(own.get(i), i);
            }
        }
        String[] cells = new String[header.size()];
        put(cells, ResultFields.TS, ResultJson.timestamp(result.timestamp()));
        put(cells, ResultFields.SITE, result.site());
        put(cells, ResultFields.UNIT, result.unit());
        putNumbers(cells, ResultFields.CYCLE + ".", "cycle", ResultFields.CYCLE_NUMBERS,
                ResultJson.cycleNumbers(result.cycle()));
        put(cells, ResultFields.METRICS_BASIS, result.metricsBasis().label());
        putNumbers(cells, ResultFields.CYCLE_RAW + ".", "cycle_raw", ResultFields.CYCLE_NUMBERS,
                ResultJson.cycleNumbers(result.cycleRaw()));
        ReconciliationResult r = result.reconciliation();
        String rp = ResultFields.RECONCILIATION + ".";
        put(cells, rp + ResultFields.STATUS, r.status());
        put(cells, rp + ResultFields.PASSED, Boolean.toString(r.passed()));
        put(cells, rp + ResultFields.CHI2, number(r.chi2()));
        putNumber(cells, rp, "reconciliation", ResultFields.CHI2_LIMIT, r.chi2Limit());
        put(cells, rp + ResultFields.REDUNDANCY, Integer.toString(r.redundancy()));
        put(cells, rp + ResultFields.ITERATIONS, Integer.toString(r.iterations()));
        for (ReconciledSensor s : r.sensors()) {
            String prefix = rp + "sensor." + s.id() + ".";
            String where = "reconciled sensor " + s.id();
            putNumber(cells, prefix, where, "measured", s.measured());
            putNumber(cells, prefix, where, "reconciled", s.reconciled());
            putNumber(cells, prefix, where, "sigma_reconciled", s.sigmaReconciled());
            putNumber(cells, prefix, where, "test_value", s.testValue());
            put(cells, prefix + ResultFields.REDUNDANCY, s.redundancy());
            put(cells, prefix + ResultFields.SUSPECT, Boolean.toString(s.suspect()));
        }
        for (ReconciledQuantity q : r.unmeasured()) {
            String prefix = rp + "unmeasured." + q.id() + ".";
            putNumber(cells, prefix, "unmeasured " + q.id(), "reconciled", q.reconciled());
            putNumber(cells, prefix, "unmeasured " + q.id(), "sigma_reconciled", q.sigmaReconciled());
        }
        StringBuilder named = new StringBuilder();
        for (Suspect s : r.suspects()) {
            named.append(named.length() == 0 ? "" : " ").append(s.id());
        }
        put(cells, ResultFields.SUSPECTS, named.toString());
        for (StateResult s : result.states()) {
            String prefix = "state." + s.id() + ".";
            putNumbers(cells, prefix, "state " + s.id(), ResultFields.STATE_NUMBERS, ResultJson.stateNumbers(s));
            put(cells, prefix + ResultFields.PHASE, s.phase().map(Phase::label).orElse(""));
            putNumber(cells, prefix, "state " + s.id(), ResultFields.SATURATION_MARGIN, s.saturationMarginK());
            putNumber(cells, prefix, "state " + s.id(), ResultFields.MASS_FLOW, s.massFlowKgPerS());
            put(cells, prefix + ResultFields.VALID, Boolean.toString(s.valid()));
            put(cells, prefix + ResultFields.REASON, s.reason().orElse(""));
        }
        for (ComponentResult c : result.components()) {
            String prefix = "component." + c.id() + ".";
            putNumbers(cells, prefix, "component " + c.id(), ResultFields.COMPONENT_NUMBERS,
                    ResultJson.componentNumbers(c));
            put(cells, prefix + ResultFields.VALID, Boolean.toString(c.valid()));
            put(cells, prefix + ResultFields.REASON, c.reason().orElse(""));
        }
        for (ClosureResult c : result.closure()) {
            String prefix = "closure." + c.id() + ".";
            put(cells, prefix + "residual_W", number(c.residualW()));
            put(cells, prefix + "sigma_W", number(c.sigmaW()));
            put(cells, prefix + "z", number(c.z()));
        }
        StringBuilder text = new StringBuilder(cells.length * 12);
        if (first) {
            row(text, header.toArray(new String[0]));
        }
        row(text, cells);
        out.write(text.toString());
    }

    private void put(String[] cells, String column, String value) {
        Integer i = index.get(column);
        if (i == null) {
            throw new IllegalArgumentException("column " + column + " is not in the header taken from the first "
                    + "record; a CSV file holds the results of one unit with one layout");
        }
        cells[i] = value;
    }

    private void putNumbers(String[] cells, String prefix, String where, List<String> names, OptionalDouble[] values) {
        for (int i = 0; i < names.size(); i++) {
            putNumber(cells, prefix, where, names.get(i), values[i]);
        }
    }

    private void putNumber(String[] cells, String prefix, String where, String name, OptionalDouble value) {
        put(cells, prefix + name, value.isPresent() ? number(ResultJson.finite(where, name, value.getAsDouble())) : "");
    }

    private static String number(double value) {
        return NumberOutput.toString(value, SHORTEST_DOUBLES);
    }

    private static void row(StringBuilder text, String[] cells) {
        for (int i = 0; i < cells.length; i++) {
            if (i > 0) {
                text.append(',');
            }
            String cell = cells[i] == null ? "" : cells[i];
            if (cell.indexOf(',') >= 0 || cell.indexOf('"') >= 0 || cell.indexOf('\n') >= 0 || cell.indexOf('\r') >= 0) {
                text.append('"').append(cell.replace("\"", "\"\"")).append('"');
            } else {
                text.append(cell);
            }
        }
        text.append('\n');
    }

    @Override
    public void flush() throws IOException {
        out.flush();
    }

    @Override
    public void close() throws IOException {
        out.close();
    }
}
