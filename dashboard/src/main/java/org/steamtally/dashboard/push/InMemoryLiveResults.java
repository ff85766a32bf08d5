package org.steamtally.dashboard.push;

import java.time.Duration;
import java.time.Instant;
import java.time.InstantSource;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.function.Consumer;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.UnitDescription;

/**
 * {@link LiveResults} held in memory and fed by {@link #publish}: the latest result per unit of one
 * plant description. Thread-safe; listeners run on the publishing thread.
 */
public final class InMemoryLiveResults implements LiveResults {

    private final PlantDescription plant;
    private final InstantSource clock;
    private final Duration staleAfter;
    private final Map<String, UnitResult> latest = new ConcurrentHashMap<>();
    private final Map<String, List<Consumer<UnitResult>>> listeners = new ConcurrentHashMap<>();

    /**
     * @param plant      the units that exist
     * @param clock      the time against which a result's age is measured
     * @param staleAfter a result older than this is reported stale
     */
    public InMemoryLiveResults(PlantDescription plant, InstantSource clock, Duration staleAfter) {
        this.plant = plant;
        this.clock = clock;
        if (staleAfter.isNegative() || staleAfter.isZero()) {
            throw new IllegalArgumentException("stale-after must be positive, was " + staleAfter);
        }
        this.staleAfter = staleAfter;
    }

    /**
     * Makes {@code result} the latest of its unit and hands it to the unit's listeners.
     *
     * @throws IllegalArgumentException if the result's site or unit is not in the plant description
     */
    public void publish(UnitResult result) {
        if (!result.site().equals(plant.siteId()) || plant.unit(result.unit()).isEmpty()) {
            throw new IllegalArgumentException("result for " + result.site() + "/" + result.unit()
                    + " does not belong to site " + plant.siteId() + " with units " + unitIds());
        }
        latest.put(result.unit(), result);
        for (Consumer<UnitResult> l : listeners.getOrDefault(result.unit(), List.of())) {
            l.accept(result);
        }
    }

    @Override
    public List<UnitStatus> units() {
        Instant now = clock.instant();
        List<UnitStatus> out = new ArrayList<>();
        for (UnitDescription u : plant.units()) {
            UnitResult r = latest.get(u.id());
            UnitStatus.Freshness f;
            if (r == null) {
                f = UnitStatus.Freshness.NO_DATA;
            } else if (Duration.between(r.timestamp(), now).compareTo(staleAfter) > 0) {
                f = UnitStatus.Freshness.STALE;
            } else {
                f = UnitStatus.Freshness.LIVE;
            }
            out.add(new UnitStatus(plant.siteId(), u.id(), u.name(), f,
                    Optional.ofNullable(r).map(UnitResult::timestamp), staleAfter));
        }
        return out;
    }

    @Override
    public Optional<UnitResult> latest(String unitId) {
        return Optional.ofNullable(latest.get(unitId));
    }

    @Override
    public Subscription subscribe(String unitId, Consumer<UnitResult> listener) {
        List<Consumer<UnitResult>> list = listeners.computeIfAbsent(unitId, k -> new CopyOnWriteArrayList<>());
        list.add(listener);
        return () -> list.remove(listener);
    }

    /** How many listeners a unit has, for tests that wait for a stream to be open. */
    public int listenerCount(String unitId) {
        return listeners.getOrDefault(unitId, List.of()).size();
    }

    private List<String> unitIds() {
        return plant.units().stream().map(UnitDescription::id).toList();
    }
}
