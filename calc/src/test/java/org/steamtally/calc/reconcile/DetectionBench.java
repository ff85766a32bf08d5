package org.steamtally.calc.reconcile;

import java.time.Duration;
import java.time.Instant;
import java.time.InstantSource;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.alarm.AlarmDefinition;
import org.steamtally.calc.alarm.AlarmEngine;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.alarm.AlarmStimulus;
import org.steamtally.calc.alarm.ReconciliationInput;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.Suspect;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.signal.SignalCheck;
import org.steamtally.calc.signal.SignalReport;
import org.steamtally.calc.signal.SignalSettings;
import org.steamtally.calc.sim.Fault;
import org.steamtally.calc.sim.SimulatedSample;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;

/**
 * Monte Carlo evaluation of bad-sensor detection on the regenerative example (fernholm unit3): the
 * simulator runs at 1 s steps on an injected clock, every snapshot goes through
 * {@link WindowMeanEvaluator} (a window of 1 is the plain {@link ReconcilingEvaluator}) and the
 * {@link AlarmEngine} (default settings for single snapshots, raised limits for window means), and
 * each fault kind is injected on each redundant sensor at each size. See docs/DETECTION.md for the
 * method and the figures; run with
 *
 * <pre>
 * java -cp calc/target/classes:calc/target/test-classes org.steamtally.calc.reconcile.DetectionBench \
 *     [trials per sensor and size] [fault-free hours] [seed] [window] [limits...] [kinds]
 * </pre>
 *
 * Not a unit test: a full run takes minutes. {@code DetectionMonteCarloTest} keeps a small
 * fixed-seed version with asserted outcomes.
 */
public final class DetectionBench {

    /** Time zero of every run; load and cooling water are held, so the time of day does not matter. */
    static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");
    /** Fault-free seconds before the fault starts, so that every alarm starts from a settled state. */
    static final int LEAD_S = 20;
    /** Seconds after the fault's start that a trial watches. */
    static final int WATCH_S = 120;
    /** The detection target's time limit. */
    static final int TARGET_S = 60;
    /** Spike probability per reading: one reading in ten jumps. */
    static final double SPIKE_PROBABILITY = 0.1;

    /** The fault kinds, with how a size k (in σ of the sensor) becomes a fault. */
    enum Kind {
        BIAS(true), DRIFT(true), STUCK(false), SPIKES(true), NOISE(true), DROPOUT(false);

        final boolean sized;

        Kind(boolean sized) {
            this.sized = sized;
        }

        String label() {
            return name().toLowerCase(Locale.ROOT);
        }

        /**
         * The fault of size k on a sensor of standard uncertainty sigma: bias k σ; a drift that reaches
         * k σ after {@link #TARGET_S}; spikes of k σ; noise multiplied by k; stuck and dropout have no size.
         */
        Fault fault(String sensor, Instant start, double k, double sigma) {
            Duration d = Duration.ofSeconds(WATCH_S + 1);
            return switch (this) {
                case BIAS -> new Fault.Bias(sensor, start, d, k * sigma);
                case DRIFT -> new Fault.Drift(sensor, start, d, k * sigma / TARGET_S);
                case STUCK -> new Fault.Stuck(sensor, start, d, OptionalDouble.empty());
                case SPIKES -> new Fault.Spikes(sensor, start, d, k * sigma, SPIKE_PROBABILITY);
                case NOISE -> new Fault.NoiseIncrease(sensor, start, d, k);
                case DROPOUT -> new Fault.Dropout(sensor, start, d);
            };
        }
    }

    /** What one trial saw. */
    record Trial(boolean detected, double secondsToDetect, boolean namedRight, boolean named, String firstNamed) {
    }

    /** The outcome of one fault kind at one size, over all sensors and trials. */
    record Row(Kind kind, double size, int trials, int detected, int detectedWithinTarget, double medianS, double p95S,
               int named, int namedRight) {

        double detectionRate() {
            return (double) detected / trials;
        }

        double withinTargetRate() {
            return (double) detectedWithinTarget / trials;
        }

        /** Right sensor named first, over the trials in which any sensor was named. */
        double namedRightRate() {
            return named == 0 ? 0.0 : (double) namedRight / named;
        }

        /** Right sensor named first, over all trials (a trial that names nobody counts as wrong). */
        double namedRightOfAll() {
            return (double) namedRight / trials;
        }
    }

    /** False alarms over a fault-free run; {@code signal} counts the frozen- and erratic-sensor alarms. */
    record FalseAlarms(double hours, int energyBalance, int suspect, int other, int signal) {

        double signalPer24h() {
            return signal * 24.0 / hours;
        }

        double energyBalancePer24h() {
            return energyBalance * 24.0 / hours;
        }

        double suspectPer24h() {
            return suspect * 24.0 / hours;
        }
    }

    private final UnitDescription unit;
    private final TruthModel truth;
    private final WindowMeanEvaluator evaluator;
    private final AlarmSettings settings;
    private final int lead;
    /**
     * The signal check's settings, or null when the trials run without it; with it, each trial
     * first runs {@link #signalWarmUp} snapshots through the signal check alone, so that its expected
     * scatter is learned before the window and the fault begin.
     */
    private final SignalSettings signal;
    private final int signalWarmUp;
    private final List<String> redundant;
    private final Map<String, Double> checkedShare = new LinkedHashMap<>();
    private final Map<String, Double> windowShare = new LinkedHashMap<>();

    /**
     * @param window   snapshots averaged before reconciliation; 1 is the per-snapshot evaluation
     * @param settings the alarm engine's settings
     */
    DetectionBench(int window, AlarmSettings settings) {
        this(window, settings, null);
    }

    /**
     * @param signal the signal check's settings; null for none. Without declared noise, the trials
     *               run its whole warm-up first.
     */
    DetectionBench(int window, AlarmSettings settings, SignalSettings signal) {
        this.signal = signal;
        this.signalWarmUp = signal == null ? 0 : signal.declaredNoiseSi().isEmpty()
                ? signal.warmUpReadings() + signal.windowReadings() : signal.windowReadings();
        unit = RegenerativeExample.unit();
        truth = TruthModel.of(unit, RegenerativeExample.designPoint());
        evaluator = WindowMeanEvaluator.compile("fernholm", unit, window);
        this.settings = settings;
        // the window is full, and every alarm settled, before the fault starts
        lead = signalWarmUp + window + LEAD_S;
        UnitResult clean = ReconcilingEvaluator.compile("fernholm", unit)
                .evaluate(Simulator.builder(truth).noiseFactor(0.0).build().step(T0).snapshot());
        List<String> ids = new ArrayList<>();
        for (ReconciledSensor s : clean.reconciliation().sensors()) {
            if (s.kind().equals("sensor") && s.redundancy().equals("redundant")) {
                ids.add(s.id());
                double u = s.sigmaMeasured().orElseThrow();
                double ur = s.sigmaReconciled().orElseThrow();
                checkedShare.put(s.id(), Math.sqrt(Math.max(0.0, 1.0 - ur * ur / (u * u))));
            }
        }
        redundant = List.copyOf(ids);
        UnitResult cleanMean = ReconcilingEvaluator.compile("fernholm", WindowMeanEvaluator.meanUncertainties(unit, WINDOW))
                .evaluate(Simulator.builder(truth).noiseFactor(0.0).build().step(T0).snapshot());
        for (ReconciledSensor s : cleanMean.reconciliation().sensors()) {
            if (checkedShare.containsKey(s.id())) {
                double u = s.sigmaMeasured().orElseThrow();
                double ur = s.sigmaReconciled().orElseThrow();
                windowShare.put(s.id(), Math.sqrt(Math.max(0.0, 1.0 - ur * ur / (u * u))));
            }
        }
    }

    /** Per redundant sensor, ρ = σ(v)/u: the share of its uncertainty the balances check. */
    Map<String, Double> checkedShare() {
        return checkedShare;
    }

    /**
     * The alarm settings for window-mean results: limits raised so that the strongly correlated
     * successive means do not cross them by chance (docs/DETECTION.md), delays as the defaults.
     */
    static AlarmSettings windowSettings(double closureLimit, double globalFactor, double suspectLimit) {
        EnumMap<AlarmKind, AlarmDefinition> kinds = AlarmSettings.defaultKinds();
        AlarmDefinition c = AlarmSettings.CLOSURE_DEFAULT;
        AlarmDefinition g = AlarmSettings.GLOBAL_TEST_DEFAULT;
        AlarmDefinition s = AlarmSettings.SUSPECT_DEFAULT;
        kinds.put(AlarmKind.CLOSURE, new AlarmDefinition(c.enabled(), c.priority(), c.onDelay(), c.offDelay(),
                closureLimit, c.deadband()));
        kinds.put(AlarmKind.GLOBAL_TEST, new AlarmDefinition(g.enabled(), g.priority(), g.onDelay(), g.offDelay(),
                globalFactor, g.deadband()));
        kinds.put(AlarmKind.SUSPECT_SENSOR, new AlarmDefinition(s.enabled(), s.priority(), s.onDelay(), s.offDelay(),
                suspectLimit, s.deadband()));
        return new AlarmSettings(kinds, Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT);
    }

    /** The redundant sensors of the example: those whose individual test can be made. */
    List<String> redundantSensors() {
        return redundant;
    }

    /** A clock the harness moves: one second of plant time per step, no wall clock. */
    private static final class StepClock implements InstantSource {
        Instant now = T0;

        @Override
        public Instant instant() {
            return now;
        }
    }

    /** One trial: the fault on the sensor once the window is full and {@link #LEAD_S} more have passed, watched for {@link #WATCH_S}. */
    Trial trial(Kind kind, String sensor, double k, long seed) {
        Instant start = T0.plusSeconds(lead);
        Simulator probe = Simulator.builder(truth).build();
        Simulator sim = Simulator.builder(truth).seed(seed)
                .fault(kind.fault(sensor, start, k, probe.sigmaOf(sensor))).build();
        StepClock clock = new StepClock();
        AlarmEngine alarms = new AlarmEngine(unit, settings, clock);
        SignalCheck check = signal == null ? null : AlarmEngine.signalCheck(unit, settings, signal);
        evaluator.clear();
        boolean detected = false;
        double seconds = Double.NaN;
        Boolean right = null;
        String first = "";
        for (int s = 0; s <= lead + WATCH_S && right == null; s++) {
            clock.now = T0.plusSeconds(s);
            SimulatedSample sample = sim.step(clock.now);
            List<AlarmEvent> signalEvents = List.of();
            Snapshot snapshot = sample.snapshot();
            if (check != null) {
                SignalReport report = check.check(snapshot);
                signalEvents = alarms.evaluateSignals(report);
                // As the daemon does: a sensor that fails its signal test is left out like a stale one.
                snapshot = report.excludingFailed(snapshot);
                if (s < signalWarmUp) {
                    continue;
                }
            }
            UnitResult result = evaluator.evaluate(snapshot);
            List<AlarmEvent> events = new ArrayList<>(signalEvents);
            events.addAll(alarms.evaluate(sample.snapshot(), result, ReconciliationInput.from(result.reconciliation())));
            if (s < lead) {
                continue;
            }
            for (AlarmEvent e : events) {
                if (e.stimulus() != AlarmStimulus.CONDITION_ACTIVE || e.kind() == AlarmKind.CALCULATION_INVALID) {
                    continue;
                }
                if (!detected) {
                    detected = true;
                    seconds = s - lead;
                }
                Optional<String> named = namedSensor(e);
                if (named.isPresent() && right == null) {
                    first = named.get() + " " + equivalents(result, named.get());
                    right = named.get().equals(sensor) || equivalents(result, named.get()).contains(sensor);
                }
            }
        }
        return new Trial(detected, seconds, Boolean.TRUE.equals(right), right != null, first);
    }

    /** The sensor an alarm names: suspect, stale and out-of-range alarms name one; the balance alarms none. */
    static Optional<String> namedSensor(AlarmEvent e) {
        return switch (e.kind()) {
            case SUSPECT_SENSOR, STALE_SENSOR, OUT_OF_RANGE, FROZEN_SENSOR, ERRATIC_SENSOR ->
                    Optional.of(e.alarmId().substring(e.kind().idPrefix().length()));
            default -> Optional.empty();
        };
    }

    /**
     * The equivalence set the reconciliation gave with the named sensor, itself included: the set of
     * the suspect it is, or of the suspect whose set holds it (the alarm is raised after its on-delay,
     * by which time another member of the same set may lead the list).
     */
    static List<String> equivalents(UnitResult result, String sensor) {
        for (Suspect s : result.reconciliation().suspects()) {
            if (s.id().equals(sensor) || s.equivalenceSet().contains(sensor)) {
                return s.equivalenceSet();
            }
        }
        return List.of(sensor);
    }

    /** The window length of the improved detection, in 1 s snapshots. */
    static final int WINDOW = 50;
    /** Alarm limits for window-mean results: closure |z|, factor on the χ² quantile, individual test value. */
    static final double WINDOW_CLOSURE_LIMIT = 4.5;
    /**
     * 1.85 on the 95 % quantile for 26 degrees (38.885), χ² ≥ 71.9: P = 3.4e-6 per snapshot, the
     * level 3.0 gave at the 5 degrees of the example before its duplicate transmitters
     * (ChiSquare.regularizedGammaQ; docs/DETECTION.md).
     */
    static final double WINDOW_GLOBAL_FACTOR = 1.85;
    static final double WINDOW_SUSPECT_LIMIT = 4.0;

    /**
     * A sensor is well checked when a 3σ bias, once it fills a {@link #WINDOW}, has a mean test value
     * 3·ρ_w·√n of at least the window's suspect limit plus z₀.₉₅ = 1.645, so that it is raised in 95 %
     * of windows; ρ_w is the checked share with the uncertainties of a window mean, in which the
     * declared constants (efficiencies, heating value) weigh more.
     */
    static final double WELL_CHECKED_TEST_VALUE = WINDOW_SUSPECT_LIMIT + 1.645;

    /** Mean test value of a 3σ bias over a full window. */
    double windowTestValueOf3Sigma(String id) {
        return 3.0 * windowShare.get(id) * Math.sqrt(WINDOW);
    }

    /** The redundant sensors that are well checked, or not. */
    List<String> sensors(boolean wellChecked) {
        return redundant.stream().filter(id -> windowTestValueOf3Sigma(id) >= WELL_CHECKED_TEST_VALUE == wellChecked)
                .toList();
    }

    /** Every redundant sensor, {@code trials} seeds each. */
    Row row(Kind kind, double k, int trials, long seed) {
        return row(kind, k, trials, seed, redundant);
    }

    /** The given sensors, {@code trials} seeds each. */
    private final java.util.Map<String, Trial> done = new java.util.HashMap<>();

    Row row(Kind kind, double k, int trials, long seed, List<String> sensorIds) {
        List<Double> times = new ArrayList<>();
        int n = 0;
        int within = 0;
        int named = 0;
        int right = 0;
        for (String sensor : sensorIds) {
            for (int t = 0; t < trials; t++) {
                long trialSeed = seed + 1_000_003L * t + sensor.hashCode();
                // the per-sensor table repeats the trials of the group rows: same seeds, same outcome
                Trial r = done.computeIfAbsent(kind + " " + sensor + " " + k + " " + trialSeed,
                        key -> trial(kind, sensor, k, trialSeed));
                n++;
                if (r.detected()) {
                    times.add(r.secondsToDetect());
                    if (r.secondsToDetect() <= TARGET_S) {
                        within++;
                    }
                }
                named += r.named() ? 1 : 0;
                right += r.namedRight() ? 1 : 0;
            }
        }
        double[] sorted = times.stream().mapToDouble(Double::doubleValue).sorted().toArray();
        return new Row(kind, k, n, sorted.length, within, quantile(sorted, 0.5), quantile(sorted, 0.95), named, right);
    }

    /** Empirical quantile (nearest rank); NaN for no data, shown as "—". */
    static double quantile(double[] sorted, double p) {
        if (sorted.length == 0) {
            return Double.NaN;
        }
        int rank = (int) Math.ceil(p * sorted.length);
        return sorted[Math.max(0, rank - 1)];
    }

    /** A fault-free run of the given length: the alarms that go active are all false. */
    FalseAlarms falseAlarms(double hours, long seed) {
        Simulator sim = Simulator.builder(truth).seed(seed).build();
        StepClock clock = new StepClock();
        AlarmEngine alarms = new AlarmEngine(unit, settings, clock);
        SignalCheck check = signal == null ? null : AlarmEngine.signalCheck(unit, settings, signal);
        evaluator.clear();
        int balance = 0;
        int suspect = 0;
        int other = 0;
        int signalAlarms = 0;
        long steps = Math.round(hours * 3600.0);
        for (long s = 0; s < steps; s++) {
            clock.now = T0.plusSeconds(s);
            SimulatedSample sample = sim.step(clock.now);
            Snapshot snapshot = sample.snapshot();
            List<AlarmEvent> events = new ArrayList<>();
            if (check != null) {
                SignalReport report = check.check(snapshot);
                events.addAll(alarms.evaluateSignals(report));
                snapshot = report.excludingFailed(snapshot);
            }
            UnitResult result = evaluator.evaluate(snapshot);
            events.addAll(alarms.evaluate(sample.snapshot(), result, ReconciliationInput.from(result.reconciliation())));
            for (AlarmEvent e : events) {
                if (e.stimulus() != AlarmStimulus.CONDITION_ACTIVE) {
                    continue;
                }
                switch (e.kind()) {
                    case CLOSURE, GLOBAL_TEST -> balance++;
                    case SUSPECT_SENSOR -> suspect++;
                    case FROZEN_SENSOR, ERRATIC_SENSOR -> {
                        signalAlarms++;
                        System.out.println("false signal alarm at " + clock.now + ": " + e.text());
                    }
                    default -> other++;
                }
            }
        }
        return new FalseAlarms(hours, balance, suspect, other, signalAlarms);
    }

    static final double[] SIZES = {2.0, 3.0, 5.0};

    /**
     * Arguments, all optional: trials per sensor and size (10), fault-free hours (24), seed
     * (20261202), window length ({@link #WINDOW}; 1 evaluates each snapshot alone with the default
     * alarm settings), then closure limit, global-test factor and suspect limit (the WINDOW_ constants
     * for a window, the defaults for 1), then a comma-separated list of fault kinds (all), then the
     * signal check: {@code none} (the default), {@code learned} (default settings, learned from a
     * full warm-up in every trial) or {@code declared} (each sensor's noise declared as its standard
     * uncertainty, which is the simulator's noise), then a comma-separated list of fault sizes in
     * standard uncertainties ({@link #SIZES}).
     */
    public static void main(String[] args) {
        int trials = args.length > 0 ? Integer.parseInt(args[0]) : 10;
        double hours = args.length > 1 ? Double.parseDouble(args[1]) : 24.0;
        long seed = args.length > 2 ? Long.parseLong(args[2]) : 20261202L;
        int window = args.length > 3 ? Integer.parseInt(args[3]) : WINDOW;
        AlarmSettings settings = args.length > 6 ? windowSettings(Double.parseDouble(args[4]),
                Double.parseDouble(args[5]), Double.parseDouble(args[6])) : window > 1
                ? windowSettings(WINDOW_CLOSURE_LIMIT, WINDOW_GLOBAL_FACTOR, WINDOW_SUSPECT_LIMIT) : AlarmSettings.DEFAULTS;
        List<Kind> kinds = args.length > 7 ? Arrays.stream(args[7].split(",")).map(k -> Kind.valueOf(
                k.toUpperCase(Locale.ROOT))).toList() : List.of(Kind.values());
        String signalMode = args.length > 8 ? args[8] : "none";
        SignalSettings signal = switch (signalMode) {
            case "none" -> null;
            case "learned" -> SignalSettings.DEFAULTS;
            case "declared" -> SignalSettings.DEFAULTS.withDeclaredNoise(RegenerativeExample.unit().sensors().stream()
                    .collect(java.util.stream.Collectors.toMap(x -> x.id(), x -> x.standardUncertaintySi())));
            default -> throw new IllegalArgumentException("signal check must be none, learned or declared, not "
                    + signalMode);
        };
        double[] sizes = args.length > 9 ? Arrays.stream(args[9].split(",")).mapToDouble(Double::parseDouble).toArray()
                : SIZES;
        long began = System.nanoTime();
        DetectionBench bench = new DetectionBench(window, settings, signal);
        System.out.println("signal check: " + signalMode + (signal == null ? "" : String.format(Locale.ROOT,
                " (window %d, warm-up %d, scatter limit %.3f, frozen limit %.0f s)", signal.windowReadings(),
                signal.warmUpReadings(), signal.scatterQuantile(),
                settings.definition(AlarmKind.FROZEN_SENSOR).limit())));
        System.out.printf(Locale.ROOT, "window %d snapshots; limits closure %.2f, global %.2f x quantile, suspect %.2f;"
                + " %d trials per sensor and size; seed %d%n", window, settings.definition(AlarmKind.CLOSURE).limit(),
                settings.definition(AlarmKind.GLOBAL_TEST).limit(), settings.definition(AlarmKind.SUSPECT_SENSOR).limit(),
                trials, seed);
        StringBuilder shares = new StringBuilder();
        bench.checkedShare.forEach((id, rho) -> shares.append(String.format(Locale.ROOT, " %s %.2f/%.2f/%.1f", id, rho,
                bench.windowShare.get(id), bench.windowTestValueOf3Sigma(id))));
        System.out.println("redundant sensors (" + bench.redundant.size() + "), rho one snapshot/rho window/3 sigma test"
                + " value over a full window:" + shares);
        for (boolean well : new boolean[] {true, false}) {
            List<String> group = bench.sensors(well);
            System.out.printf(Locale.ROOT, "%n%s (3 sigma bias test value over a full window %s %.2f): %s%n",
                    well ? "well-checked sensors" : "weakly checked sensors", well ? ">=" : "<", WELL_CHECKED_TEST_VALUE,
                    group);
            System.out.println(HEADER);
            for (Kind kind : kinds) {
                for (double k : kind.sized ? sizes : new double[] {Double.NaN}) {
                    System.out.println(format(bench.row(kind, kind.sized ? k : 0.0, trials, seed, group)));
                }
            }
        }
        if (kinds.contains(Kind.BIAS)) {
            System.out.printf(Locale.ROOT, "%n3 sigma bias, per sensor%n| sensor | rho 1 / rho w / test w | trials | detected | within 60 s |"
                    + " median s | p95 s | named | right first (of named) | right first (of all) |%n"
                    + "| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |%n");
            for (String id : bench.redundant) {
                Row r = bench.row(Kind.BIAS, 3.0, trials, seed, List.of(id));
                System.out.println(format(r).replaceFirst("\\| bias \\| 3σ", String.format(Locale.ROOT,
                        "| %s | %.2f / %.2f / %.1f", id, bench.checkedShare.get(id), bench.windowShare.get(id),
                        bench.windowTestValueOf3Sigma(id))));
            }
        }
        FalseAlarms fa = bench.falseAlarms(hours, seed ^ 0x5DEECE66DL);
        System.out.printf(Locale.ROOT, "fault-free %.1f h: %d energy-balance alarms (%.2f per 24 h), %d suspect alarms"
                + " (%.2f per 24 h), %d frozen/erratic alarms (%.2f per 24 h), %d others%n", fa.hours(), fa.energyBalance(),
                fa.energyBalancePer24h(), fa.suspect(), fa.suspectPer24h(), fa.signal(), fa.signalPer24h(), fa.other());
        System.out.printf(Locale.ROOT, "wall time %.0f s%n", (System.nanoTime() - began) / 1e9);
    }

    static final String HEADER = "| fault | size | trials | detected | within 60 s | median s | p95 s | named |"
            + " right first (of named) | right first (of all) |\n| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |";

    static String format(Row r) {
        String size = r.kind().sized ? (r.kind() == Kind.NOISE ? "×" + (int) r.size() : (int) r.size() + "σ") : "n/a";
        return String.format(Locale.ROOT, "| %s | %s | %d | %.1f %% | %.1f %% | %s | %s | %.1f %% | %.1f %% | %.1f %% |",
                r.kind().label(), size, r.trials(), 100 * r.detectionRate(), 100 * r.withinTargetRate(),
                seconds(r.medianS()), seconds(r.p95S()), 100.0 * r.named() / r.trials(), 100 * r.namedRightRate(),
                100 * r.namedRightOfAll());
    }

    private static String seconds(double s) {
        return Double.isNaN(s) ? "—" : String.format(Locale.ROOT, "%.0f", s);
    }
}
