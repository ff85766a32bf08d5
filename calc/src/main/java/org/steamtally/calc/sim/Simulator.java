package org.steamtally.calc.sim;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.SplittableRandom;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.stream.Stream;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;

/**
 * A plant simulator for tests, demos and commissioning: the {@link TruthModel} driven by a load
 * program and a daily cooling-water cycle, read through instruments with Gaussian noise and
 * injectable faults. Quasi-steady: each step is the truth at that instant's load and cooling-water
 * temperature, without storage or thermal inertia.
 *
 * <p>Noise: each sensor reads truth + f · u · z, with u its declared standard uncertainty, f its
 * noise factor (1 unless configured) and z a standard normal deviate (Box–Muller from the sensor's
 * own stream). Every sensor has its own random streams, split from the seed in sensor order, and
 * draws exactly one deviate per step whatever the faults, so a fault on one sensor never changes
 * another sensor's readings, and the same seed, program and faults give the same readings.
 *
 * <p>Faults, applied in this order on a sensor: a noise increase multiplies f; bias, drift and
 * spikes add; stuck replaces the reading; dropout sends nothing. Faults come from a
 * {@link Scenario} at construction or {@link #addFault} at any time, from any thread.
 *
 * <p>Runs as fast as it computes: time is whatever instant {@link #step} is given, never the wall clock.
 * Steps are serialised (the methods are synchronized); give instants in increasing order so that a
 * stuck fault freezes on its first reading.
 */
public final class Simulator {

    private final TruthModel truth;
    private final UnitDescription unit;
    private final Sensor[] sensors;
    private final Map<String, Integer> sensorIndex = new HashMap<>();
    private final double[] noiseFactor;
    private final SplittableRandom[] noise;
    private final SplittableRandom[] faultRandom;
    private final LoadProgram load;
    private final DailyCycle coolingWater;
    private final CopyOnWriteArrayList<Fault> faults = new CopyOnWriteArrayList<>();
    private final Map<Fault, Double> stuckAt = new HashMap<>();
    private TruthPoint lastTruth;

    private Simulator(Builder b) {
        truth = b.truth;
        unit = truth.unit();
        sensors = unit.sensors().toArray(new Sensor[0]);
        noiseFactor = new double[sensors.length];
        noise = new SplittableRandom[sensors.length];
        faultRandom = new SplittableRandom[sensors.length];
        SplittableRandom root = new SplittableRandom(b.seed);
        for (int i = 0; i < sensors.length; i++) {
            sensorIndex.put(sensors[i].id(), i);
            noise[i] = root.split();
            faultRandom[i] = root.split();
            noiseFactor[i] = b.defaultNoiseFactor;
        }
        b.noiseFactors.forEach((sensor, f) -> noiseFactor[index(sensor)] = f);
        load = b.load;
        coolingWater = b.coolingWater;
        for (Fault f : b.faults) {
            addFault(f);
        }
    }

    /** A builder for a simulator of the truth model's unit. */
    public static Builder builder(TruthModel truth) {
        return new Builder(truth);
    }

    private int index(String sensorId) {
        Integer i = sensorIndex.get(sensorId);
        if (i == null) {
            throw new IllegalArgumentException("no sensor \"" + sensorId + "\" in unit \"" + unit.id() + "\"; sensors: "
                    + sensorIndex.keySet());
        }
        return i;
    }

    /** A sensor's declared standard uncertainty u, SI: the unit in which faults are sized as "k σ". */
    public double sigmaOf(String sensorId) {
        return sensors[index(sensorId)].standardUncertaintySi();
    }

    /** Adds a fault; thread-safe, effective from the next step whose instant is within it. */
    public void addFault(Fault fault) {
        Objects.requireNonNull(fault, "fault");
        index(fault.sensorId());
        faults.add(fault);
    }

    /** Adds every fault of a scenario. */
    public void addScenario(Scenario scenario) {
        scenario.faults().forEach(this::addFault);
    }

    /** The faults added so far, in the order added. */
    public List<Fault> faults() {
        return List.copyOf(faults);
    }

    /** The operating conditions the load program and the daily cycle give at an instant. */
    public OperatingConditions conditionsAt(Instant t) {
        return new OperatingConditions(load.loadAt(t), coolingWater.shiftK(t));
    }

    /**
     * The truth and the instruments' readings at one instant.
     *
     * @throws TruthModelException when the load program reaches an operating point the truth model cannot represent
     */
    public synchronized SimulatedSample step(Instant t) {
        Objects.requireNonNull(t, "t");
        OperatingConditions conditions = conditionsAt(t);
        TruthPoint point = lastTruth != null && lastTruth.conditions().equals(conditions) ? lastTruth : truth.at(conditions);
        lastTruth = point;
        double[] trueValues = point.sensorValuesSi();
        double[] values = new double[sensors.length];
        Snapshot.SensorStatus[] status = new Snapshot.SensorStatus[sensors.length];
        List<SimulatedReading> readings = new ArrayList<>(sensors.length);
        List<Fault> active = faults;
        for (int i = 0; i < sensors.length; i++) {
            double z = gaussian(noise[i]);
            double f = noiseFactor[i];
            double offset = 0.0;
            Fault.Stuck stuck = null;
            boolean dropped = false;
            for (Fault fault : active) {
                if (!fault.sensorId().equals(sensors[i].id()) || !fault.activeAt(t)) {
                    continue;
                }
                if (fault instanceof Fault.NoiseIncrease ni) {
                    f *= ni.factor();
                } else if (fault instanceof Fault.Bias bias) {
                    offset += bias.offsetSi();
                } else if (fault instanceof Fault.Drift drift) {
                    offset += drift.ratePerSecondSi() * Duration.between(drift.start(), t).toNanos() * 1e-9;
                } else if (fault instanceof Fault.Spikes spikes) {
                    if (faultRandom[i].nextDouble() < spikes.probability()) {
                        offset += faultRandom[i].nextBoolean() ? spikes.amplitudeSi() : -spikes.amplitudeSi();
                    }
                } else if (fault instanceof Fault.Stuck s) {
                    stuck = stuck == null ? s : stuck;
                } else {
                    dropped = true;
                }
            }
            double reading = trueValues[i] + f * sensors[i].standardUncertaintySi() * z + offset;
            if (stuck != null) {
                if (stuck.valueSi().isPresent()) {
                    reading = stuck.valueSi().getAsDouble();
                } else {
                    Double held = stuckAt.putIfAbsent(stuck, reading);
                    reading = held == null ? reading : held;
                }
            }
            if (dropped) {
                values[i] = 0.0;
                status[i] = Snapshot.SensorStatus.MISSING;
            } else {
                values[i] = reading;
                status[i] = Snapshot.SensorStatus.GOOD;
                readings.add(new SimulatedReading(sensors[i].id(), sensors[i].topic(), t, reading));
            }
        }
        return new SimulatedSample(t, point, new Snapshot(t, unit.id(), values, status), readings);
    }

    /** Steps from {@code start} every {@code period}, lazily, without end: limit the stream. */
    public Stream<SimulatedSample> stream(Instant start, Duration period) {
        Objects.requireNonNull(start, "start");
        if (period.isNegative() || period.isZero()) {
            throw new IllegalArgumentException("period must be positive, was " + period);
        }
        return Stream.iterate(start, t -> t.plus(period)).map(this::step);
    }

    /** A standard normal deviate by the Box–Muller transform (Box and Muller, 1958), two draws. */
    private static double gaussian(SplittableRandom r) {
        double u1 = 1.0 - r.nextDouble();
        double u2 = r.nextDouble();
        return Math.sqrt(-2.0 * Math.log(u1)) * Math.cos(2.0 * Math.PI * u2);
    }

    /** Collects a simulator's settings; each method returns the builder. */
    public static final class Builder {
        private final TruthModel truth;
        private long seed = 1L;
        private double defaultNoiseFactor = 1.0;
        private final Map<String, Double> noiseFactors = new LinkedHashMap<>();
        private LoadProgram load = LoadProgram.constant(1.0);
        private DailyCycle coolingWater = DailyCycle.NONE;
        private final List<Fault> faults = new ArrayList<>();

        private Builder(TruthModel truth) {
            this.truth = Objects.requireNonNull(truth, "truth");
        }

        /** The seed of every random stream. */
        public Builder seed(long seed) {
            this.seed = seed;
            return this;
        }

        /** The noise factor of every sensor not given its own, ≥ 0 (0 for noise-free readings). */
        public Builder noiseFactor(double factor) {
            defaultNoiseFactor = checkFactor(factor, "default");
            return this;
        }

        /** One sensor's noise factor, ≥ 0. */
        public Builder noiseFactor(String sensorId, double factor) {
            noiseFactors.put(Objects.requireNonNull(sensorId, "sensorId"), checkFactor(factor, sensorId));
            return this;
        }

        public Builder load(LoadProgram program) {
            load = Objects.requireNonNull(program, "program");
            return this;
        }

        public Builder coolingWater(DailyCycle cycle) {
            coolingWater = Objects.requireNonNull(cycle, "cycle");
            return this;
        }

        public Builder fault(Fault fault) {
            faults.add(Objects.requireNonNull(fault, "fault"));
            return this;
        }

        public Builder scenario(Scenario scenario) {
            faults.addAll(scenario.faults());
            return this;
        }

        public Simulator build() {
            return new Simulator(this);
        }

        private static double checkFactor(double f, String what) {
            if (!(f >= 0.0) || !Double.isFinite(f)) {
                throw new IllegalArgumentException("noise factor (" + what + ") must be a finite number ≥ 0, was " + f);
            }
            return f;
        }
    }
}
