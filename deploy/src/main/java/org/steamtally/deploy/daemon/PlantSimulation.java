package org.steamtally.deploy.daemon;

import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.Locale;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.SimulatedReading;
import org.steamtally.calc.sim.SimulatedSample;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.collector.mqtt.ReadingPublisher;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * A simulated unit publishing its readings over MQTT: each step of the {@link Simulator} at the
 * clock's instant becomes one message per sensor, {@code {"ts": ms, "value": v, "unit": "Pa"}} in the
 * SI unit of the sensor's quantity (the collector converts any unit of the right quantity), QoS 1,
 * on the sensor's topic from the plant description. Sensors without a topic are not published.
 */
public final class PlantSimulation implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(PlantSimulation.class);

    private final UnitDescription unit;
    private final Simulator simulator;
    private final ReadingPublisher publisher;
    private final Clock clock;
    private final AtomicLong published = new AtomicLong();
    private final AtomicLong failedSteps = new AtomicLong();
    private ScheduledExecutorService timer;

    public PlantSimulation(UnitDescription unit, Simulator simulator, ReadingPublisher publisher, Clock clock) {
        this.unit = unit;
        this.simulator = simulator;
        this.publisher = publisher;
        this.clock = clock;
    }

    public Simulator simulator() {
        return simulator;
    }

    public UnitDescription unit() {
        return unit;
    }

    /** Messages handed to the publisher so far. */
    public long published() {
        return published.get();
    }

    /** Publishes one step at {@code t}. */
    public void publishStep(Instant t) throws InterruptedException {
        SimulatedSample sample = simulator.step(t);
        for (SimulatedReading r : sample.readings()) {
            if (r.topic().isEmpty()) {
                continue;
            }
            String siUnit = unit.sensor(r.sensorId()).map(Sensor::quantity).map(q -> q.siUnit()).orElse("");
            String payload = String.format(Locale.ROOT, "{\"ts\":%d,\"value\":%s,\"unit\":\"%s\"}",
                    r.timestamp().toEpochMilli(), Double.toString(r.valueSi()), siUnit);
            publisher.publish(r.topic().get(), payload.getBytes(StandardCharsets.UTF_8), 1);
            published.incrementAndGet();
        }
    }

    /** Publishes a step every {@code period}, at the clock's instant, until closed. */
    public synchronized void startPeriodic(Duration period) {
        timer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "steamtally-sim-" + unit.id());
            t.setDaemon(true);
            return t;
        });
        long ms = period.toMillis();
        timer.scheduleAtFixedRate(() -> {
            try {
                publishStep(Instant.ofEpochMilli(clock.millis()));
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            } catch (RuntimeException e) {
                if (failedSteps.incrementAndGet() % 60 == 1) {
                    LOG.warn("simulated unit {}: step not published: {}", unit.id(), e.toString());
                }
            }
        }, 0, ms, TimeUnit.MILLISECONDS);
    }

    @Override
    public synchronized void close() {
        if (timer != null) {
            timer.shutdownNow();
            try {
                timer.awaitTermination(5, TimeUnit.SECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
        publisher.close();
    }
}
