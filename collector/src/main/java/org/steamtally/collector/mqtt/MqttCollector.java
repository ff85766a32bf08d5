package org.steamtally.collector.mqtt;

import io.micrometer.core.instrument.MeterRegistry;
import java.time.Clock;
import java.util.List;
import java.util.Objects;
import java.util.function.UnaryOperator;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.ingest.DeadLetterSink;
import org.steamtally.collector.ingest.IngestPipeline;
import org.steamtally.collector.ingest.SnapshotSlot;
import org.steamtally.collector.ingest.TopicMap;

/**
 * The collector wired together for a daemon: the topic map from the plant description and the
 * settings, the {@link IngestPipeline} with its worker, the {@link MessageSource} feeding it, and the
 * dead-letter republisher when a topic is configured. The calc takes snapshots from {@link #slot}.
 */
public final class MqttCollector implements AutoCloseable {

    private final IngestPipeline pipeline;
    private final MessageSource source;

    private MqttCollector(IngestPipeline pipeline, MessageSource source) {
        this.pipeline = pipeline;
        this.source = source;
    }

    /**
     * Builds and starts everything; returns at once while the connection is made in the background.
     *
     * @throws IllegalArgumentException when the settings do not fit the plant (topic template, barometer)
     * @throws IllegalStateException    when a secret or TLS store cannot be read
     */
    public static MqttCollector start(PlantDescription plant, CollectorSettings settings, MeterRegistry registry,
                                      Clock clock, ConnectionListener listener, UnaryOperator<String> environment) {
        Objects.requireNonNull(plant, "plant");
        TopicMap topics = TopicMap.of(plant, settings.topicTemplate());
        DeadLetterSink[] deadLetters = {DeadLetterSink.NONE};
        IngestPipeline pipeline = new IngestPipeline(plant, topics, settings, registry, clock,
                (topic, payload, reason, message) -> deadLetters[0].refused(topic, payload, reason, message));
        MessageSource source = MessageSources.open(settings, topics.subscriptionFilters(), listener, registry, clock,
                environment);
        settings.deadLetterTopic().ifPresent(t -> deadLetters[0] = new MqttDeadLetters(source, t, registry));
        pipeline.start();
        source.start(pipeline::submit);
        return new MqttCollector(pipeline, source);
    }

    /** Where snapshots of unit {@code unitId} are handed over (the newest wins). */
    public SnapshotSlot slot(String unitId) {
        return pipeline.slot(unitId);
    }

    /** Every unit's slot, in the plant description's order. */
    public List<SnapshotSlot> slots() {
        return pipeline.slots();
    }

    /** The broker connection's state. */
    public ConnectionState connectionState() {
        return source.state();
    }

    /** Disconnects (keeping the broker-side session) and stops the worker. */
    @Override
    public void close() {
        source.close();
        pipeline.close();
    }
}
