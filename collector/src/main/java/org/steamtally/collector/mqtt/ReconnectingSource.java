package org.steamtally.collector.mqtt;

import java.time.Duration;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.concurrent.Executors;
import java.util.concurrent.RejectedExecutionException;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.Semaphore;
import java.util.concurrent.TimeUnit;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.steamtally.collector.config.CollectorSettings;

/**
 * The reconnect logic both protocol versions share: one thread of its own connects, subscribes, and on
 * a loss or a failed attempt waits for the {@link Backoff} and tries again, over the broker URLs in
 * order (failover is the client's, which walks the list on each attempt). Paho's own automatic
 * reconnect is off: it has no jitter and does not resubscribe when the broker lost the session.
 */
abstract class ReconnectingSource implements MessageSource {

    private static final Logger LOG = LoggerFactory.getLogger(ReconnectingSource.class);
    /** Filters named in the connection line at INFO; the full list goes to DEBUG. */
    static final int FILTERS_SHOWN = 3;

    /** Bounds each connect and subscribe handshake, s. */
    static final int HANDSHAKE_TIMEOUT_S = 10;
    /** {@link #HANDSHAKE_TIMEOUT_S} in ms, as Paho's {@code waitForCompletion} takes it. */
    static final long HANDSHAKE_TIMEOUT_MS = HANDSHAKE_TIMEOUT_S * 1000L;
    /** Dead letters and other fire-and-forget publications allowed in flight at once. */
    static final int SIDE_PUBLISH_WINDOW = 64;
    static final int QOS_AT_LEAST_ONCE = 1;

    protected final CollectorSettings settings;
    protected final List<String> filters;
    private final Semaphore sideWindow = new Semaphore(SIDE_PUBLISH_WINDOW);
    private final ConnectionWatch watch;
    private final Backoff backoff;
    private final ScheduledExecutorService thread;
    private volatile MessageHandler handler;
    private volatile boolean closed;
    private long failures;

    ReconnectingSource(CollectorSettings settings, List<String> filters, ConnectionWatch watch, Backoff backoff) {
        this.settings = Objects.requireNonNull(settings, "settings");
        this.filters = List.copyOf(filters);
        if (this.filters.isEmpty()) {
            throw new IllegalArgumentException("nothing to subscribe to: no sensor has a topic");
        }
        this.watch = Objects.requireNonNull(watch, "watch");
        this.backoff = Objects.requireNonNull(backoff, "backoff");
        this.thread = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "steamtally-mqtt-" + settings.clientId());
            t.setDaemon(true);
            return t;
        });
    }

    @Override
    public void start(MessageHandler handler) {
        this.handler = Objects.requireNonNull(handler, "handler");
        thread.scheduleAtFixedRate(watch::check, 1, 1, TimeUnit.SECONDS);
        thread.execute(this::attempt);
    }

    @Override
    public ConnectionState state() {
        return watch.state();
    }

    /** The filters as subscribed: with the shared-subscription prefix when a group is set. */
    protected List<String> subscribedFilters() {
        return settings.sharedGroup().map(g -> filters.stream().map(f -> "$share/" + g + "/" + f).toList())
                .orElse(filters);
    }

    private void attempt() {
        if (closed) {
            return;
        }
        watch.set(ConnectionState.CONNECTING, Optional.empty());
        try {
            connectAndSubscribe();
            backoff.reset();
            failures = 0;
            watch.set(ConnectionState.CONNECTED, Optional.empty());
            List<String> subscribed = subscribedFilters();
            // One topic per sensor makes thousands of filters for a fleet: a count and a few at INFO.
            LOG.info("connected to {} as {} and subscribed to {}", describeServer(), settings.clientId(),
                    filterSummary(subscribed));
            LOG.debug("subscribed filters: {}", subscribed);
        } catch (Exception e) {
            if (closed) {
                return;
            }
            disconnectQuietly();
            failures++;
            Duration delay = backoff.next();
            // Every attempt is logged at first, then every tenth, so a long outage does not flood the log.
            if (failures <= 3 || failures % 10 == 0) {
                LOG.warn("connecting to {} failed (attempt {}): {}; next attempt in {} ms", settings.brokerUrls(),
                        failures, e.toString(), delay.toMillis());
            }
            watch.set(ConnectionState.DISCONNECTED, Optional.of(e));
            schedule(delay);
        }
    }

    /** How many filters of this client there are, and the first few: a log line of bounded length. */
    static String filterSummary(List<String> filters) {
        int shown = Math.min(FILTERS_SHOWN, filters.size());
        String first = String.join(", ", filters.subList(0, shown));
        if (filters.size() <= FILTERS_SHOWN) {
            return filters.size() + (filters.size() == 1 ? " filter: " : " filters: ") + first;
        }
        return filters.size() + " filters: " + first + ", ... (" + (filters.size() - shown)
                + " more, listed at DEBUG)";
    }

    /** Called by a subclass for each message the client receives. */
    protected final void arrived(String topic, byte[] payload) {
        MessageHandler h = handler;
        if (h != null) {
            h.onMessage(topic, payload);
        }
    }

    /** Called by a subclass when a publication made by {@link #publishAsync} completes, either way. */
    protected final void sideDone() {
        sideWindow.release();
    }

    /** Called by a subclass when the client reports the connection lost. */
    protected void lost(Throwable cause) {
        // Only a loss of an established connection schedules an attempt; a failed attempt schedules its own.
        if (closed || watch.state() != ConnectionState.CONNECTED) {
            return;
        }
        watch.set(ConnectionState.DISCONNECTED, Optional.ofNullable(cause));
        Duration delay = backoff.next();
        LOG.warn("connection to {} lost: {}; reconnecting in {} ms", describeServer(), cause, delay.toMillis());
        schedule(delay);
    }

    private void schedule(Duration delay) {
        try {
            thread.schedule(this::attempt, delay.toMillis(), TimeUnit.MILLISECONDS);
        } catch (RejectedExecutionException e) {
            // Closed meanwhile.
        }
    }

    @Override
    public boolean tryPublish(String topic, byte[] payload, int qos) {
        if (watch.state() != ConnectionState.CONNECTED || !sideWindow.tryAcquire()) {
            return false;
        }
        try {
            publishAsync(topic, payload, qos);
            return true;
        } catch (Exception e) {
            sideWindow.release();
            return false;
        }
    }

    @Override
    public void close() {
        if (closed) {
            return;
        }
        closed = true;
        thread.shutdownNow();
        try {
            thread.awaitTermination(HANDSHAKE_TIMEOUT_S, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        disconnectQuietly();
        try {
            closeClient();
        } catch (Exception e) {
            // Closing a client that never connected may complain; it holds nothing more.
        }
        watch.set(ConnectionState.CLOSED, Optional.empty());
    }

    private void disconnectQuietly() {
        try {
            disconnect();
        } catch (Exception e) {
            // Gone already; nothing else to release here.
        }
    }

    /** The server connected to, or the configured list while there is none. */
    private String describeServer() {
        String uri = currentServerUri();
        return uri == null ? String.join(",", settings.brokerUrls()) : uri;
    }

    /** Connects (blocking, bounded by {@link #HANDSHAKE_TIMEOUT_S}) and subscribes every filter at QoS 1. */
    protected abstract void connectAndSubscribe() throws Exception;

    /** Publishes without waiting; the completion, success or failure, must call {@link #sideDone}. */
    protected abstract void publishAsync(String topic, byte[] payload, int qos) throws Exception;

    /** Disconnects if connected, waiting at most {@link #HANDSHAKE_TIMEOUT_MS}; any exception is ignored. */
    protected abstract void disconnect() throws Exception;

    /** Releases the client for good; any exception is ignored. */
    protected abstract void closeClient() throws Exception;

    /** The server the client is connected to, or null when there is none. */
    protected abstract String currentServerUri();
}
