package org.steamtally.dashboard.store;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.List;

/**
 * The process {@link KilledWriterTest} kills: writes result records at simulated 1 Hz timestamps
 * as fast as it can into an embedded store and into a store that is never reachable (so that every
 * point goes to its journal), and after each block of records, once both stores have taken them,
 * prints {@code written <k>}.
 */
public final class KilledWriterChild {

    static final int BLOCK = 20;

    private KilledWriterChild() {
    }

    /** A store that never answers. */
    static final class Unreachable extends WriteOnlyBackend {
        @Override
        public String name() {
            return "unreachable";
        }

        @Override
        public void write(List<Point> points) throws StoreUnavailableException {
            throw new StoreUnavailableException("never reachable", null);
        }
    }

    /** Arguments: H2 data directory, its spool directory, the unreachable store's spool directory. */
    public static void main(String[] args) throws Exception {
        Clock clock = Clock.systemUTC();
        SpooledStore embedded = SpooledStore.open(
                H2Store.open(Path.of(args[0]), Duration.ofDays(3650), Duration.ofHours(1), clock),
                SpoolSettings.forNominalRate(Path.of(args[1]), 100, 300), new SimpleMeterRegistry(),
                StoreListener.NONE, clock);
        SpooledStore spooled = SpooledStore.open(new Unreachable(),
                SpoolSettings.forNominalRate(Path.of(args[2]), 100, 300), new SimpleMeterRegistry(),
                StoreListener.NONE, clock);
        for (int k = 0; ; k++) {
            var record = StoreFixtures.record(StoreFixtures.T0.plusSeconds(k), k);
            embedded.writeResult(record);
            // Only into the database: its suspect table must agree with its raw rows after the kill.
            embedded.writeReconciliation(StoreFixtures.reconciliation(StoreFixtures.T0.plusSeconds(k), k % 3 == 0,
                    2.0 + k % 5, k % 4 == 0, 3.0 + k % 7));
            spooled.writeResult(record);
            if (k % BLOCK == BLOCK - 1) {
                if (!embedded.flush(Duration.ofSeconds(30)) || !spooled.flush(Duration.ofSeconds(30))) {
                    throw new IllegalStateException("stores did not take block ending at " + k);
                }
                // Wait for the embedded store's commit too, not only for the hand-over.
                while (embedded.backend().points(Measurement.CYCLE, StoreFixtures.SITE, StoreFixtures.UNIT,
                        StoreFixtures.T0.plusSeconds(k), StoreFixtures.T0.plusSeconds(k + 1)).isEmpty()) {
                    Thread.onSpinWait();
                }
                System.out.println("written " + k);
                System.out.flush();
            }
        }
    }
}
