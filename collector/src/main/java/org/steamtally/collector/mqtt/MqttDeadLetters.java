package org.steamtally.collector.mqtt;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import java.util.Base64;
import java.util.Objects;
import org.steamtally.collector.ingest.DeadLetterSink;
import org.steamtally.collector.ingest.RejectionReason;

/**
 * Republishes refused payloads at QoS 0 to {@code <prefix>/<reason>} as a JSON object
 * {@code {"topic", "reason", "message", "payload_base64"}}, so the original bytes survive whatever they
 * were. Never blocks: when the connection is down or too many are in flight the letter is dropped and
 * counted ({@code steamtally.deadletters.dropped}).
 */
public final class MqttDeadLetters implements DeadLetterSink {

    private static final ObjectMapper JSON = new ObjectMapper();

    private final MessageSource source;
    private final String prefix;
    private final Counter sent;
    private final Counter dropped;

    public MqttDeadLetters(MessageSource source, String prefix, MeterRegistry registry) {
        this.source = Objects.requireNonNull(source, "source");
        this.prefix = Objects.requireNonNull(prefix, "prefix");
        this.sent = Counter.builder("steamtally.deadletters.sent").register(registry);
        this.dropped = Counter.builder("steamtally.deadletters.dropped").register(registry);
    }

    @Override
    public void refused(String topic, byte[] payload, RejectionReason reason, String message) {
        ObjectNode letter = JSON.createObjectNode();
        letter.put("topic", topic);
        letter.put("reason", reason.tag());
        letter.put("message", message);
        letter.put("payload_base64", Base64.getEncoder().encodeToString(payload));
        byte[] bytes;
        try {
            bytes = JSON.writeValueAsBytes(letter);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            dropped.increment();
            return;
        }
        if (source.tryPublish(prefix + "/" + reason.tag(), bytes, 0)) {
            sent.increment();
        } else {
            dropped.increment();
        }
    }
}
