package org.steamtally.collector.config;

import java.net.URI;
import java.net.URISyntaxException;
import java.time.Duration;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;

/**
 * The collector's settings, the {@code collector:} section of the plant description (see
 * {@code docs/PLANT_DESCRIPTION.md}). Secrets appear only as {@link SecretRef}s, so the record can be
 * logged whole.
 *
 * @param brokerUrls         broker URLs, tried in order (failover), {@code tcp://}, {@code ssl://},
 *                           {@code ws://} or {@code wss://}; at least one
 * @param protocol           MQTT 5 or 3.1.1
 * @param clientId           the MQTT client id; with a persistent session it names the session, so it
 *                           must stay the same across restarts and differ between daemons
 * @param username           where the user name is kept, if the broker wants one
 * @param password           where the password is kept
 * @param trustStorePath     a PKCS#12 or JKS trust store for {@code ssl://} brokers; the JVM's
 *                           default trust when empty
 * @param trustStorePassword where the trust store's password is kept
 * @param keyStorePath       a PKCS#12 key store with the client certificate, for brokers that ask for one
 * @param keyStorePassword   where the key store's password is kept
 * @param sessionExpiry      how long the broker keeps the session (and queues QoS 1 readings) while the
 *                           collector is away; zero asks for a clean session. MQTT 5 only; a 3.1.1
 *                           broker keeps a persistent session as long as it chooses
 * @param sharedGroup        MQTT 5 shared-subscription group: daemons in the same group split the
 *                           messages of each filter ({@code $share/group/filter})
 * @param topicTemplate      maps topics to sensors: {@code {site}}, {@code {unit}} and {@code {sensor}}
 *                           stand for ids, e.g. {@code {site}/{unit}/{sensor}}; a sensor's own
 *                           {@code topic} wins over the template
 * @param maxPayloadBytes    longest accepted payload, bytes
 * @param maxFutureSkew      a reading stamped further ahead of the collector's clock is refused; one
 *                           ahead by less is taken as stamped now (the publisher's clock runs fast)
 * @param maxPastAge         a reading stamped further behind the collector's clock is refused
 * @param snapshotPeriod     time between snapshots of a unit
 * @param allowedLateness    how long a snapshot waits for late readings before it is emitted
 * @param deadLetterTopic    refused payloads are republished under this topic prefix, when given
 * @param downAlarmAfter     a connection down longer than this raises an alarm-worthy event
 * @param reconnectMin       the first reconnect delay; it doubles per failed attempt, with jitter
 * @param reconnectMax       the longest reconnect delay
 * @param queueMessages      capacity of the queue between the MQTT client and the worker, messages
 * @param queueBytes         capacity of that queue, payload bytes
 * @param barometer          id of a pressure sensor whose latest good reading replaces the site's
 *                           atmospheric pressure for gauge-pressure readings
 */
public record CollectorSettings(
        List<String> brokerUrls,
        MqttProtocol protocol,
        String clientId,
        Optional<SecretRef> username,
        Optional<SecretRef> password,
        Optional<String> trustStorePath,
        Optional<SecretRef> trustStorePassword,
        Optional<String> keyStorePath,
        Optional<SecretRef> keyStorePassword,
        Duration sessionExpiry,
        Optional<String> sharedGroup,
        Optional<String> topicTemplate,
        int maxPayloadBytes,
        Duration maxFutureSkew,
        Duration maxPastAge,
        Duration snapshotPeriod,
        Duration allowedLateness,
        Optional<String> deadLetterTopic,
        Duration downAlarmAfter,
        Duration reconnectMin,
        Duration reconnectMax,
        int queueMessages,
        long queueBytes,
        Optional<String> barometer) {

    /** Longest session expiry MQTT 5 can express short of "never": 2³² − 2 s (MQTT 5.0, 3.1.2.11.2). */
    public static final long MAX_SESSION_EXPIRY_S = 0xFFFF_FFFEL;
    /** Largest payload the parser will read at all. */
    public static final int MAX_PAYLOAD_BYTES = 64 * 1024;

    public static final Duration DEFAULT_SESSION_EXPIRY = Duration.ofDays(1);
    public static final int DEFAULT_MAX_PAYLOAD_BYTES = 16 * 1024;
    public static final Duration DEFAULT_MAX_FUTURE_SKEW = Duration.ofSeconds(5);
    public static final Duration DEFAULT_MAX_PAST_AGE = Duration.ofHours(1);
    public static final Duration DEFAULT_SNAPSHOT_PERIOD = Duration.ofSeconds(1);
    public static final Duration DEFAULT_ALLOWED_LATENESS = Duration.ofMillis(500);
    public static final Duration DEFAULT_DOWN_ALARM_AFTER = Duration.ofSeconds(30);
    public static final Duration DEFAULT_RECONNECT_MIN = Duration.ofMillis(100);
    public static final Duration DEFAULT_RECONNECT_MAX = Duration.ofSeconds(30);
    public static final int DEFAULT_QUEUE_MESSAGES = 65_536;
    public static final long DEFAULT_QUEUE_BYTES = 32L * 1024 * 1024;

    private static final Set<String> SCHEMES = Set.of("tcp", "ssl", "ws", "wss");

    public CollectorSettings {
        brokerUrls = List.copyOf(brokerUrls);
        if (brokerUrls.isEmpty()) {
            throw new IllegalArgumentException("at least one broker URL is needed, e.g. tcp://127.0.0.1:1883");
        }
        for (String url : brokerUrls) {
            checkUrl(url);
        }
        Objects.requireNonNull(protocol, "protocol");
        Objects.requireNonNull(clientId, "clientId");
        if (clientId.isBlank() || clientId.length() > 256) {
            throw new IllegalArgumentException("client id must be 1 to 256 characters, was \"" + clientId + "\"");
        }
        Objects.requireNonNull(username, "username");
        Objects.requireNonNull(password, "password");
        Objects.requireNonNull(trustStorePath, "trustStorePath");
        Objects.requireNonNull(trustStorePassword, "trustStorePassword");
        Objects.requireNonNull(keyStorePath, "keyStorePath");
        Objects.requireNonNull(keyStorePassword, "keyStorePassword");
        if (password.isPresent() && username.isEmpty()) {
            throw new IllegalArgumentException("a password needs a user name (MQTT 3.1.1, 3.1.2.9)");
        }
        requireRange("session expiry", sessionExpiry, Duration.ZERO, Duration.ofSeconds(MAX_SESSION_EXPIRY_S));
        Objects.requireNonNull(sharedGroup, "sharedGroup");
        sharedGroup.ifPresent(g -> {
            if (g.isEmpty() || g.contains("/") || g.contains("+") || g.contains("#")) {
                throw new IllegalArgumentException("shared subscription group must be a non-empty name without"
                        + " /, + or # (MQTT 5.0, 4.8.2), was \"" + g + "\"");
            }
        });
        if (sharedGroup.isPresent() && protocol != MqttProtocol.MQTT_5) {
            throw new IllegalArgumentException("shared subscriptions need MQTT 5, but the protocol is "
                    + protocol.label());
        }
        Objects.requireNonNull(topicTemplate, "topicTemplate");
        if (maxPayloadBytes < 1 || maxPayloadBytes > MAX_PAYLOAD_BYTES) {
            throw new IllegalArgumentException("max payload must lie within 1 to " + MAX_PAYLOAD_BYTES
                    + " bytes, was " + maxPayloadBytes);
        }
        requireRange("max future skew", maxFutureSkew, Duration.ZERO, Duration.ofDays(1));
        requireRange("max past age", maxPastAge, Duration.ofSeconds(1), Duration.ofDays(366));
        requireRange("snapshot period", snapshotPeriod, Duration.ofMillis(1), Duration.ofHours(1));
        requireRange("allowed lateness", allowedLateness, Duration.ZERO, Duration.ofHours(1));
        Objects.requireNonNull(deadLetterTopic, "deadLetterTopic");
        deadLetterTopic.ifPresent(t -> {
            if (t.isEmpty() || t.contains("+") || t.contains("#")) {
                throw new IllegalArgumentException("dead-letter topic must be a topic name without wildcards, was \""
                        + t + "\"");
            }
        });
        requireRange("down alarm threshold", downAlarmAfter, Duration.ofSeconds(1), Duration.ofDays(1));
        requireRange("first reconnect delay", reconnectMin, Duration.ofMillis(1), Duration.ofMinutes(10));
        requireRange("longest reconnect delay", reconnectMax, reconnectMin, Duration.ofHours(1));
        if (queueMessages < 1) {
            throw new IllegalArgumentException("queue capacity must be at least 1 message, was " + queueMessages);
        }
        if (queueBytes < MAX_PAYLOAD_BYTES) {
            throw new IllegalArgumentException("queue capacity must be at least " + MAX_PAYLOAD_BYTES
                    + " bytes, was " + queueBytes);
        }
        Objects.requireNonNull(barometer, "barometer");
    }

    /** Settings with every default, for the given brokers and client id. */
    public static Builder builder(List<String> brokerUrls, String clientId) {
        return new Builder(brokerUrls, clientId);
    }

    /** A copy with other settings; see {@link Builder}. */
    public Builder toBuilder() {
        Builder b = new Builder(brokerUrls, clientId);
        b.protocol = protocol;
        b.username = username;
        b.password = password;
        b.trustStorePath = trustStorePath;
        b.trustStorePassword = trustStorePassword;
        b.keyStorePath = keyStorePath;
        b.keyStorePassword = keyStorePassword;
        b.sessionExpiry = sessionExpiry;
        b.sharedGroup = sharedGroup;
        b.topicTemplate = topicTemplate;
        b.maxPayloadBytes = maxPayloadBytes;
        b.maxFutureSkew = maxFutureSkew;
        b.maxPastAge = maxPastAge;
        b.snapshotPeriod = snapshotPeriod;
        b.allowedLateness = allowedLateness;
        b.deadLetterTopic = deadLetterTopic;
        b.downAlarmAfter = downAlarmAfter;
        b.reconnectMin = reconnectMin;
        b.reconnectMax = reconnectMax;
        b.queueMessages = queueMessages;
        b.queueBytes = queueBytes;
        b.barometer = barometer;
        return b;
    }

    private static void checkUrl(String url) {
        Objects.requireNonNull(url, "broker URL");
        URI uri;
        try {
            uri = new URI(url);
        } catch (URISyntaxException e) {
            throw new IllegalArgumentException("broker URL \"" + url + "\" is not a URL: " + e.getReason());
        }
        if (uri.getScheme() == null || !SCHEMES.contains(uri.getScheme()) || uri.getHost() == null) {
            throw new IllegalArgumentException("broker URL \"" + url + "\" must be tcp://, ssl://, ws:// or wss://"
                    + " with a host, e.g. tcp://127.0.0.1:1883");
        }
    }

    private static void requireRange(String what, Duration d, Duration min, Duration max) {
        Objects.requireNonNull(d, what);
        if (d.compareTo(min) < 0 || d.compareTo(max) > 0) {
            throw new IllegalArgumentException(what + " must lie within " + min + " to " + max + ", was " + d);
        }
    }

    /** Builds settings from the defaults; every setter returns the builder. */
    public static final class Builder {
        private final List<String> brokerUrls;
        private final String clientId;
        private MqttProtocol protocol = MqttProtocol.MQTT_5;
        private Optional<SecretRef> username = Optional.empty();
        private Optional<SecretRef> password = Optional.empty();
        private Optional<String> trustStorePath = Optional.empty();
        private Optional<SecretRef> trustStorePassword = Optional.empty();
        private Optional<String> keyStorePath = Optional.empty();
        private Optional<SecretRef> keyStorePassword = Optional.empty();
        private Duration sessionExpiry = DEFAULT_SESSION_EXPIRY;
        private Optional<String> sharedGroup = Optional.empty();
        private Optional<String> topicTemplate = Optional.empty();
        private int maxPayloadBytes = DEFAULT_MAX_PAYLOAD_BYTES;
        private Duration maxFutureSkew = DEFAULT_MAX_FUTURE_SKEW;
        private Duration maxPastAge = DEFAULT_MAX_PAST_AGE;
        private Duration snapshotPeriod = DEFAULT_SNAPSHOT_PERIOD;
        private Duration allowedLateness = DEFAULT_ALLOWED_LATENESS;
        private Optional<String> deadLetterTopic = Optional.empty();
        private Duration downAlarmAfter = DEFAULT_DOWN_ALARM_AFTER;
        private Duration reconnectMin = DEFAULT_RECONNECT_MIN;
        private Duration reconnectMax = DEFAULT_RECONNECT_MAX;
        private int queueMessages = DEFAULT_QUEUE_MESSAGES;
        private long queueBytes = DEFAULT_QUEUE_BYTES;
        private Optional<String> barometer = Optional.empty();

        private Builder(List<String> brokerUrls, String clientId) {
            this.brokerUrls = brokerUrls;
            this.clientId = clientId;
        }

        public Builder protocol(MqttProtocol v) { protocol = v; return this; }
        public Builder username(SecretRef v) { username = Optional.ofNullable(v); return this; }
        public Builder password(SecretRef v) { password = Optional.ofNullable(v); return this; }
        public Builder trustStore(String path, SecretRef pw) {
            trustStorePath = Optional.ofNullable(path);
            trustStorePassword = Optional.ofNullable(pw);
            return this;
        }
        public Builder keyStore(String path, SecretRef pw) {
            keyStorePath = Optional.ofNullable(path);
            keyStorePassword = Optional.ofNullable(pw);
            return this;
        }
        public Builder sessionExpiry(Duration v) { sessionExpiry = v; return this; }
        public Builder sharedGroup(String v) { sharedGroup = Optional.ofNullable(v); return this; }
        public Builder topicTemplate(String v) { topicTemplate = Optional.ofNullable(v); return this; }
        public Builder maxPayloadBytes(int v) { maxPayloadBytes = v; return this; }
        public Builder maxFutureSkew(Duration v) { maxFutureSkew = v; return this; }
        public Builder maxPastAge(Duration v) { maxPastAge = v; return this; }
        public Builder snapshotPeriod(Duration v) { snapshotPeriod = v; return this; }
        public Builder allowedLateness(Duration v) { allowedLateness = v; return this; }
        public Builder deadLetterTopic(String v) { deadLetterTopic = Optional.ofNullable(v); return this; }
        public Builder downAlarmAfter(Duration v) { downAlarmAfter = v; return this; }
        public Builder reconnect(Duration min, Duration max) { reconnectMin = min; reconnectMax = max; return this; }
        public Builder queue(int messages, long bytes) { queueMessages = messages; queueBytes = bytes; return this; }
        public Builder barometer(String v) { barometer = Optional.ofNullable(v); return this; }

        /** @throws IllegalArgumentException naming the first setting out of range */
        public CollectorSettings build() {
            return new CollectorSettings(brokerUrls, protocol, clientId, username, password, trustStorePath,
                    trustStorePassword, keyStorePath, keyStorePassword, sessionExpiry, sharedGroup, topicTemplate,
                    maxPayloadBytes, maxFutureSkew, maxPastAge, snapshotPeriod, allowedLateness, deadLetterTopic,
                    downAlarmAfter, reconnectMin, reconnectMax, queueMessages, queueBytes, barometer);
        }
    }
}
