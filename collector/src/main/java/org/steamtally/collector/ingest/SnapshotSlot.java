package org.steamtally.collector.ingest;

import io.micrometer.core.instrument.Counter;
import java.time.Duration;
import java.util.Objects;
import java.util.Optional;
import org.steamtally.calc.cycle.Snapshot;

/**
 * The hand-over of one unit's snapshots from the ingest worker to their consumer (the calc): a slot
 * of one. When the consumer falls behind, a new snapshot replaces the one not yet taken (the newest
 * wins, since the calc only ever wants the current state) and the replaced one is counted, so memory
 * stays at one snapshot per unit however slow the consumer is. Safe between one producer and any
 * number of consumers.
 */
public final class SnapshotSlot {

    private final String unitId;
    private final Counter coalesced;
    private Snapshot pending;

    SnapshotSlot(String unitId, Counter coalesced) {
        this.unitId = Objects.requireNonNull(unitId, "unitId");
        this.coalesced = Objects.requireNonNull(coalesced, "coalesced");
    }

    /** The unit whose snapshots pass here. */
    public String unitId() {
        return unitId;
    }

    synchronized void put(Snapshot snapshot) {
        if (pending != null) {
            coalesced.increment();
        }
        pending = snapshot;
        notifyAll();
    }

    /** The snapshot waiting, taken out of the slot; empty when none waits. Never blocks. */
    public synchronized Optional<Snapshot> poll() {
        Snapshot s = pending;
        pending = null;
        return Optional.ofNullable(s);
    }

    /**
     * Waits up to {@code timeout} for a snapshot and takes it.
     *
     * @return the snapshot, or empty when none came in time
     * @throws InterruptedException when the waiting thread is interrupted
     */
    public synchronized Optional<Snapshot> take(Duration timeout) throws InterruptedException {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (pending == null) {
            long left = deadline - System.nanoTime();
            if (left <= 0) {
                return Optional.empty();
            }
            wait(Math.max(1, left / 1_000_000));
        }
        return poll();
    }

    /** How many snapshots were replaced before their consumer took them. */
    public long coalescedCount() {
        return (long) coalesced.count();
    }
}
