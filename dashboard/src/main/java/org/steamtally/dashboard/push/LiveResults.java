package org.steamtally.dashboard.push;

import java.util.List;
import java.util.Optional;
import java.util.function.Consumer;
import org.steamtally.calc.cycle.UnitResult;

/**
 * The dashboard's view of the results the daemon computes: which units exist and how fresh their
 * results are, the latest result of each, and a subscription to new ones. The daemon's wiring
 * implements it over the cycle model's output; {@link InMemoryLiveResults} is a plain implementation
 * fed by calls to {@code publish}.
 *
 * <p>Listeners may be called on any thread and must return quickly; the HTTP layer hands each result
 * on to its own event loop.
 */
public interface LiveResults {

    /** Every unit of the plant, in the plant description's order, with the freshness of its results. */
    List<UnitStatus> units();

    /** The latest result of a unit, empty when the unit is unknown or has no result yet. */
    Optional<UnitResult> latest(String unitId);

    /**
     * Calls {@code listener} with every new result of {@code unitId} until the returned subscription
     * is closed.
     */
    Subscription subscribe(String unitId, Consumer<UnitResult> listener);

    /** Stops a listener; closing twice does nothing. */
    @FunctionalInterface
    interface Subscription extends AutoCloseable {
        @Override
        void close();
    }
}
