package org.steamtally.dashboard.store;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Arrays;
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
 * Load driver for the store (a benchmark, not a test): sustained points per second into each
 * adapter, and the time of an 8-hour shift summary from the embedded store. docs/PERFORMANCE.md
 * gives the command and the figures.
 *
 * <p>The record has the shape of the regenerative example (deploy/examples/regenerative.yaml): 20
 * states, 8 components, the cycle and 6 first-law checks, 35 points; its reconciliation covers the
 * example's 36 sensors, 37 points. The values are made up.
 *
 * <pre>
 * StoreLoadDriver h2 UNITS SECONDS             # records of UNITS units at 1 Hz for SECONDS simulated seconds
 * StoreLoadDriver h2-batches UNITS SECONDS ROUNDS SIZE...
 *                                              # records with their reconciliation, as the daemon writes
 *                                              # them, in batches of each SIZE points taking turns
 * StoreLoadDriver influxdb URL UNITS SECONDS
 * StoreLoadDriver shift [DIR [ROUNDS [FIRST]]] # 8 h at 1 Hz for one unit, then shift summaries;
 *                                              # with DIR, the data of an earlier run there; ROUNDS
 *                                              # (default 3) reopenings each from raw rows and from
 *                                              # the per-minute rollups, alternating, FIRST (raw or
 *                                              # rollup, default raw) going first
 * </pre>
 */
public final class StoreLoadDriver {

    private static final int STATES = 20;
    /** The counts below can be set to the fleet's mix: -Dload.components=12 -Dload.closures=5 -Dload.sensors=57. */
    private static final int COMPONENTS = Integer.getInteger("load.components", 8);
    private static final int CLOSURES = Integer.getInteger("load.closures", 6);
    private static final int SENSORS = Integer.getInteger("load.sensors", 36);
    private static final Instant START = Instant.parse("2026-11-02T05:00:00Z");

    /** Process CPU per point of the last {@link #run}, µs. */
    private static double lastCpuMicrosPerPoint;

    private StoreLoadDriver() {
    }

    static UnitResult record(String unit, Instant ts, int k) {
        List<StateResult> states = new ArrayList<>(STATES);
        for (int i = 0; i < STATES; i++) {
            states.add(new StateResult("state_" + i, of(1.0e6 * (i + 1) + k % 7), of(300.0 + 25 * i), of(2.0e5 * i),
                    of(500.0 * i), of(0.001 * (i + 1)), i == 6 ? of(0.9) : none(),
                    Optional.of(i == 6 ? Phase.TWO_PHASE : Phase.VAPOUR), of(10.0 + i), of(125.0 - i),
                    true, Optional.empty()));
        }
        List<ComponentResult> components = new ArrayList<>(COMPONENTS);
        for (int i = 0; i < COMPONENTS; i++) {
            components.add(new ComponentResult("component_" + i, "turbine", of(1.0e6 * i), of(2.0e7 + i),
                    of(0.88), of(1.0e6 + k % 11), true, Optional.empty()));
        }
        double eta = 0.38 + 0.001 * (k % 13);
        CycleResult cycle = new CycleResult(of(3.9e8), of(2.4e8), of(1.52e8), of(2.0e6), of(1.5e8), of(eta),
                of(0.013), of(3600.0 / eta), of(0.62), of(0.55));
        List<ClosureResult> closures = new ArrayList<>(CLOSURES);
        for (int i = 0; i < CLOSURES; i++) {
            double z = ((k + i) % 9 - 4) * 0.6;
            closures.add(new ClosureResult("check_" + i, z * 1.0e6, 1.0e6, z));
        }
        return new UnitResult(ts, "fernholm", unit, states, components, cycle, closures);
    }

    static StoredReconciliation reconciliation(String unit, Instant ts, int k) {
        List<StoredReconciliation.Sensor> sensors = new ArrayList<>(SENSORS);
        for (int i = 0; i < SENSORS; i++) {
            boolean suspect = (k + i) % 97 == 0;
            sensors.add(new StoredReconciliation.Sensor("S-" + i, 100.0 + i, 100.1 + i, 0.3, suspect ? 3.5 : 0.4,
                    suspect));
        }
        return new StoredReconciliation(ts, "fernholm", unit, 8.2, 15.5, 9, true, sensors);
    }

    private static OptionalDouble of(double v) {
        return OptionalDouble.of(v);
    }

    private static OptionalDouble none() {
        return OptionalDouble.empty();
    }

    public static void main(String[] args) throws Exception {
        switch (args[0]) {
            case "h2" -> {
                Path dir = Files.createTempDirectory("steamtally-load-h2");
                throughput(H2Store.open(dir.resolve("data"), Duration.ofDays(3650), Duration.ofHours(1),
                        Clock.systemUTC()), dir, Integer.parseInt(args[1]), Integer.parseInt(args[2]));
            }
            case "influxdb" -> {
                Path dir = Files.createTempDirectory("steamtally-load-influx");
                String db = "steamtally_load_" + System.nanoTime();
                throughput(InfluxStore.connect(InfluxSettings.of(args[1], db)), dir, Integer.parseInt(args[2]),
                        Integer.parseInt(args[3]));
                try (var influx = org.influxdb.InfluxDBFactory.connect(args[1])) {
                    influx.query(new org.influxdb.dto.Query("DROP DATABASE \"" + db + "\"", null, true));
                }
            }
            case "h2-batches" -> batches(Integer.parseInt(args[1]), Integer.parseInt(args[2]),
                    Integer.parseInt(args[3]), Arrays.stream(args, 4, args.length).mapToInt(Integer::parseInt).toArray());
            case "shift" -> shift(args.length > 1 ? Path.of(args[1]) : null,
                    args.length > 2 ? Integer.parseInt(args[2]) : 3, args.length > 3 && args[3].equals("rollup"));
            case "trend" -> trend(Path.of(args[1]), Integer.parseInt(args[2]));
            default -> throw new IllegalArgumentException("usage: h2 UNITS SECONDS | influxdb URL UNITS SECONDS"
                    + " | shift; got " + Arrays.toString(args));
        }
    }

    /**
     * Records with their reconciliation (72 points, as the daemon writes them) into a new embedded
     * store per round and batch size, the batch sizes taking turns within each round so that all
     * see the same machine load; prints each batch size's points/s per round and the median.
     */
    private static void batches(int units, int seconds, int rounds, int[] sizes) throws Exception {
        List<List<Double>> rates = new ArrayList<>();
        List<List<Double>> cpus = new ArrayList<>();
        for (int b = 0; b < sizes.length; b++) {
            rates.add(new ArrayList<>());
            cpus.add(new ArrayList<>());
        }
        for (int r = 0; r < rounds; r++) {
            for (int i = 0; i < sizes.length; i++) {
                // Rotate who goes first, so that no batch size always meets a cold JIT or a warm cache.
                int b = (i + r) % sizes.length;
                Path dir = Files.createTempDirectory("steamtally-load-h2-batch");
                double rate = run(H2Store.open(dir.resolve("data"), Duration.ofDays(3650), Duration.ofHours(1),
                        Clock.systemUTC()), dir, units, seconds, sizes[b], true);
                rates.get(b).add(rate);
                cpus.get(b).add(lastCpuMicrosPerPoint);
                System.out.printf("round %d, batch %d: %.0f points/s, %.1f µs CPU per point%n", r + 1, sizes[b], rate,
                        lastCpuMicrosPerPoint);
            }
        }
        for (int b = 0; b < sizes.length; b++) {
            double[] v = rates.get(b).stream().mapToDouble(Double::doubleValue).sorted().toArray();
            System.out.printf("batch %d: median %.0f points/s over %d rounds (min %.0f, max %.0f)%n", sizes[b],
                    v.length % 2 == 1 ? v[v.length / 2] : (v[v.length / 2 - 1] + v[v.length / 2]) / 2, v.length,
                    v[0], v[v.length - 1]);
            double[] c = cpus.get(b).stream().mapToDouble(Double::doubleValue).sorted().toArray();
            System.out.printf("batch %d: median %.1f µs CPU per point (min %.1f, max %.1f)%n", sizes[b],
                    c.length % 2 == 1 ? c[c.length / 2] : (c[c.length / 2 - 1] + c[c.length / 2]) / 2, c[0],
                    c[c.length - 1]);
        }
    }

    /** Writes UNITS records per simulated second as fast as the store takes them. */
    private static void throughput(StoreBackend backend, Path dir, int units, int seconds) throws Exception {
        run(backend, dir, units, seconds, 0, false);
    }

    /**
     * Writes UNITS records (with their reconciliation when {@code withReconciliation}) per simulated
     * second as fast as the store takes them, in batches of {@code batchSize} points (0: the default).
     *
     * @return points per second
     */
    private static double run(StoreBackend backend, Path dir, int units, int seconds, int batchSize,
            boolean withReconciliation) throws Exception {
        int perRecord = ResultPoints.of(record("u", START, 0)).size()
                + (withReconciliation ? ResultPoints.of(reconciliation("u", START, 0)).size() : 0);
        SpoolSettings settings = SpoolSettings.forNominalRate(dir.resolve("spool"), units * perRecord, 300);
        if (batchSize > 0) {
            settings = settings.withBatchSize(batchSize);
        }
        try (SpooledStore store = SpooledStore.open(backend, settings, new SimpleMeterRegistry(), StoreListener.NONE,
                Clock.systemUTC())) {
            // Warm-up: one simulated minute, not counted.
            for (int k = 0; k < 60; k++) {
                for (int u = 0; u < units; u++) {
                    store.writeResult(record("unit" + u, START.minusSeconds(3600 - k), k));
                    if (withReconciliation) {
                        store.writeReconciliation(reconciliation("unit" + u, START.minusSeconds(3600 - k), k));
                    }
                }
                store.flush(Duration.ofMinutes(5));
            }
            store.awaitDrained(Duration.ofMinutes(5));
            // CPU of the whole process (writer, H2's serialisation thread, this producer), as that is
            // what the rest of a daemon would miss.
            com.sun.management.OperatingSystemMXBean os = (com.sun.management.OperatingSystemMXBean)
                    java.lang.management.ManagementFactory.getOperatingSystemMXBean();
            long cpu0 = os.getProcessCpuTime();
            long t0 = System.nanoTime();
            for (int k = 0; k < seconds; k++) {
                for (int u = 0; u < units; u++) {
                    store.writeResult(record("unit" + u, START.plusSeconds(k), k));
                    if (withReconciliation) {
                        store.writeReconciliation(reconciliation("unit" + u, START.plusSeconds(k), k));
                    }
                }
                // Bounded: keep at most a few simulated seconds in memory, as a live feed would.
                if (k % 5 == 4 && !store.flush(Duration.ofMinutes(5))) {
                    throw new IllegalStateException("store did not keep up");
                }
            }
            if (!store.awaitDrained(Duration.ofMinutes(10))) {
                throw new IllegalStateException("store did not drain");
            }
            double s = (System.nanoTime() - t0) / 1e9;
            double cpuS = (os.getProcessCpuTime() - cpu0) / 1e9;
            long points = (long) units * seconds * perRecord;
            lastCpuMicrosPerPoint = cpuS * 1e6 / points;
            System.out.printf("%s: %d units x %d s x %d points = %d points in %.2f s: %.0f points/s, %.0f records/s"
                    + " (1 Hz per unit needs %d points/s), spooled %d; process CPU %.2f s, %.1f µs per point%n",
                    backend.name(), units, seconds, perRecord, points, s, points / s, units * (double) seconds / s,
                    units * perRecord, store.spooledPoints(), cpuS, lastCpuMicrosPerPoint);
            return points / s;
        }
    }

    /**
     * 8 hours at 1 Hz of one unit, then shift summaries: first after reopening, then warm; in each
     * round once from the raw rows and once from the rollups (which goes first alternates), so that
     * both see the same machine load.
     */
    private static void shift(Path existing, int rounds, boolean rollupFirst) throws Exception {
        Path dir = existing != null ? existing : Files.createTempDirectory("steamtally-load-shift");
        Duration eight = Duration.ofHours(8);
        if (existing == null) {
            load(dir, eight);
        }
        List<double[]> raw = new ArrayList<>();
        List<double[]> rollup = new ArrayList<>();
        for (int r = 0; r < rounds; r++) {
            for (int m = 0; m < 2; m++) {
                boolean useRollup = (r + m + (rollupFirst ? 1 : 0)) % 2 == 1;
                (useRollup ? rollup : raw).add(summaries(dir, eight, useRollup));
            }
        }
        System.out.printf("medians over %d rounds, ms: first after reopening raw %.1f, rollup %.1f;"
                + " warm median raw %.1f, rollup %.1f%n", rounds, median(raw, 0), median(rollup, 0),
                median(raw, 2), median(rollup, 2));
    }

    /**
     * Trends read per series (a sensor's reconciled and measured values, a check's residual), each
     * over 8 hours in 1-minute buckets, from the data of {@code shift} in DIR: ROUNDS
     * times each, the median and range of the wall time printed.
     */
    private static void trend(Path dir, int rounds) throws Exception {
        try (H2Store h2 = H2Store.open(dir.resolve("data"), Duration.ofDays(3650), Duration.ofHours(1),
                Clock.systemUTC())) {
            for (SeriesRef s : List.of(SeriesRef.of(Measurement.RECONCILIATION, "fernholm", "unit1", "S-3", "reconciled",
                    "measured"), SeriesRef.of(Measurement.CLOSURE, "fernholm", "unit1", "check_2", "residual_W",
                    "sigma_W"), SeriesRef.of(Measurement.STATES, "fernholm", "unit1", "state_4", "p_Pa"))) {
                double[] ms = new double[rounds];
                long n = 0;
                for (int r = 0; r < rounds; r++) {
                    // A window shifted by r minutes each time, so that H2 cannot reuse an earlier result.
                    Instant from = START.plus(Duration.ofMinutes(r));
                    long t0 = System.nanoTime();
                    n = h2.buckets(s, from, from.plus(Duration.ofHours(8)), Duration.ofMinutes(1)).values().iterator().next().stream()
                            .mapToLong(Bucket::count).sum();
                    ms[r] = (System.nanoTime() - t0) / 1e6;
                }
                Arrays.sort(ms);
                System.out.printf("trend %s %s over 8 h (%d samples): median %.1f ms (min %.1f, max %.1f)%n",
                        s.measurement().measurementName(), s.id(), n, ms[rounds / 2], ms[0], ms[rounds - 1]);
            }
        }
    }

    private static double median(List<double[]> runs, int column) {
        double[] v = runs.stream().mapToDouble(a -> a[column]).sorted().toArray();
        return v.length % 2 == 1 ? v[v.length / 2] : (v[v.length / 2 - 1] + v[v.length / 2]) / 2;
    }

    private static void load(Path dir, Duration eight) throws Exception {
        // 22 minutes beyond the shift, so that windows shifted by up to 20 minutes still hold 8 h of data.
        int seconds = (int) eight.plusMinutes(22).toSeconds();
        long t0 = System.nanoTime();
        try (H2Store h2 = H2Store.open(dir.resolve("data"), Duration.ofDays(3650), Duration.ofHours(1),
                Clock.systemUTC())) {
            List<Point> batch = new ArrayList<>();
            for (int k = 0; k < seconds; k++) {
                Instant ts = START.plusSeconds(k);
                batch.addAll(ResultPoints.of(record("unit1", ts, k)));
                batch.addAll(ResultPoints.of(reconciliation("unit1", ts, k)));
                if (k % 30 == 29) {
                    h2.write(batch);
                    batch.clear();
                }
                if (k % 1800 == 0) {
                    h2.write(List.of(ResultPoints.of(new StoredAlarmEvent(ts, "fernholm", "unit1", "closure_" + k,
                            "transition", "high", "normal", "unacknowledged", true, none(), none(),
                            Optional.empty(), Optional.empty()))));
                    h2.write(List.of(ResultPoints.of(new StoredAlarmEvent(ts.plusSeconds(600), "fernholm", "unit1",
                            "closure_" + k, "transition", "unacknowledged", "normal", "normal", false, none(),
                            none(), Optional.empty(), Optional.empty()))));
                }
            }
            h2.write(batch);
        }
        System.out.printf("loaded %d s of one unit (%d points per second) in %.1f s%n", seconds,
                ResultPoints.of(record("u", START, 0)).size() + ResultPoints.of(reconciliation("u", START, 0)).size(),
                (System.nanoTime() - t0) / 1e9);
        System.out.println("data in " + dir);
    }

    /** @return first after reopening ms and CPU ms, warm median ms and CPU ms, warm max ms */
    private static double[] summaries(Path dir, Duration eight, boolean useRollup) throws Exception {
        // CPU time of the whole process: the summary's queries run in two threads.
        com.sun.management.OperatingSystemMXBean os = (com.sun.management.OperatingSystemMXBean)
                java.lang.management.ManagementFactory.getOperatingSystemMXBean();
        try (SpooledStore store = SpooledStore.open(H2Store.open(dir.resolve("data"), Duration.ofDays(3650),
                Duration.ofHours(1), Clock.systemUTC(), useRollup), SpoolSettings.forNominalRate(dir.resolve("spool"), 100,
                300), new SimpleMeterRegistry(), StoreListener.NONE, Clock.systemUTC())) {
            ShiftSummary first = null;
            double[] ms = new double[21];
            double[] cpu = new double[21];
            for (int i = 0; i < ms.length; i++) {
                // A new window each time (shifted by i minutes, as shift starts are whole minutes), so
                // H2 cannot answer from its result cache.
                Instant start = START.plus(Duration.ofMinutes(i));
                Shift shift = new Shift(LocalDate.of(2026, 11, 2), "bench", start, start.plus(eight));
                long s = System.nanoTime();
                long c = os.getProcessCpuTime();
                ShiftSummary summary = store.shiftSummary("fernholm", "unit1", shift);
                cpu[i] = (os.getProcessCpuTime() - c) / 1e6;
                ms[i] = (System.nanoTime() - s) / 1e6;
                if (first == null) {
                    first = summary;
                }
            }
            double[] warm = Arrays.copyOfRange(ms, 1, ms.length);
            double[] warmCpu = Arrays.copyOfRange(cpu, 1, cpu.length);
            Arrays.sort(warm);
            Arrays.sort(warmCpu);
            System.out.printf("8-hour shift summary from H2 (%s): first after reopening %.1f ms (CPU %.1f ms); warm"
                    + " median %.1f ms (CPU %.1f ms), max %.1f ms over %d shifted windows%n",
                    useRollup ? "rollup" : "raw", ms[0], cpu[0],
                    warm[warm.length / 2], warmCpu[warmCpu.length / 2], warm[warm.length - 1], warm.length);
            System.out.printf("  (energy in %.1f MWh, out %.1f MWh, covered %s, %d checks, alarms active %s,"
                    + " %d suspects)%n", first.energyInMWh(), first.energyOutMWh(), first.covered(),
                    first.closures().size(), first.alarmsActive(), first.topSuspects().size());
            return new double[] {ms[0], cpu[0], warm[warm.length / 2], warmCpu[warmCpu.length / 2],
                warm[warm.length - 1]};
        }
    }
}
