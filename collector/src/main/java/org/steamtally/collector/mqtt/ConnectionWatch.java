package org.steamtally.collector.mqtt;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.Gauge;
import io.micrometer.core.instrument.MeterRegistry;
import java.time.Clock;
import java.time.Duration;
import java.util.Objects;
import java.util.Optional;

/**
 * Keeps a connection's state as meters ({@code steamtally.mqtt.connected}, 1 or 0;
 * {@code steamtally.mqtt.state}, the {@link ConnectionState} ordinal; {@code steamtally.mqtt.connects}
 * and {@code steamtally.mqtt.down.alarms}) and raises {@link ConnectionListener#downTooLong} once per
 * outage longer than the threshold. Time from the injected clock; {@link #check} is called
 * periodically by the source (and directly by tests).
 */
public final class ConnectionWatch {

    private final Clock clock;
    private final long thresholdMillis;
    private final ConnectionListener listener;
    private final Counter connects;
    private final Counter downAlarms;
    private volatile ConnectionState state = ConnectionState.DISCONNECTED;
    private long downSinceMillis;
    private boolean alarmed;

    public ConnectionWatch(Clock clock, Duration threshold, ConnectionListener listener, MeterRegistry registry) {
        this.clock = Objects.requireNonNull(clock, "clock");
        this.thresholdMillis = threshold.toMillis();
        this.listener = Objects.requireNonNull(listener, "listener");
        this.downSinceMillis = clock.millis();
        Gauge.builder("steamtally.mqtt.connected", this, w -> w.state == ConnectionState.CONNECTED ? 1 : 0)
                .description("1 while connected and subscribed to the broker").register(registry);
        Gauge.builder("steamtally.mqtt.state", this, w -> w.state.ordinal())
                .description("0 disconnected, 1 connecting, 2 connected, 3 closed").register(registry);
        connects = Counter.builder("steamtally.mqtt.connects").register(registry);
        downAlarms = Counter.builder("steamtally.mqtt.down.alarms")
                .description("outages longer than the alarm threshold").register(registry);
    }

    /** The state now. */
    public ConnectionState state() {
        return state;
    }

    /** Records a new state and tells the listener. */
    public synchronized void set(ConnectionState next, Optional<Throwable> cause) {
        ConnectionState previous = state;
        state = next;
        if (next == ConnectionState.CONNECTED) {
            connects.increment();
            alarmed = false;
        } else if (previous == ConnectionState.CONNECTED) {
            downSinceMillis = clock.millis();
        }
        safely(() -> listener.stateChanged(next, cause));
    }

    /** Raises the alarm once when the connection has been down longer than the threshold. */
    public synchronized void check() {
        if (state == ConnectionState.CONNECTED || state == ConnectionState.CLOSED || alarmed) {
            return;
        }
        long down = clock.millis() - downSinceMillis;
        if (down > thresholdMillis) {
            alarmed = true;
            downAlarms.increment();
            safely(() -> listener.downTooLong(Duration.ofMillis(down)));
        }
    }

    private static void safely(Runnable r) {
        try {
            r.run();
        } catch (RuntimeException e) {
            // A listener's fault must not stop reconnecting.
        }
    }
}
