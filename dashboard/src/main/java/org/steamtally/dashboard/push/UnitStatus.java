package org.steamtally.dashboard.push;

import java.time.Duration;
import java.time.Instant;
import java.util.Objects;
import java.util.Optional;

/**
 * One unit and the freshness of its results.
 *
 * @param siteId     the site's id
 * @param unitId     the unit's id
 * @param name       the display name from the plant description
 * @param freshness  whether results are arriving
 * @param lastResult the timestamp of the latest result, when there is one
 * @param staleAfter a result older than this is stale
 */
public record UnitStatus(String siteId, String unitId, String name, Freshness freshness,
                         Optional<Instant> lastResult, Duration staleAfter) {

    public UnitStatus {
        Objects.requireNonNull(siteId, "siteId");
        Objects.requireNonNull(unitId, "unitId");
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(freshness, "freshness");
        Objects.requireNonNull(lastResult, "lastResult");
        Objects.requireNonNull(staleAfter, "staleAfter");
        if (staleAfter.isNegative() || staleAfter.isZero()) {
            throw new IllegalArgumentException("unit " + unitId + ": stale-after must be positive, was " + staleAfter);
        }
    }

    /** How fresh a unit's results are. */
    public enum Freshness {
        /** The latest result is younger than the stale-after age. */
        LIVE,
        /** The latest result is older than the stale-after age: its values must not be read as current. */
        STALE,
        /** No result has arrived since the dashboard started. */
        NO_DATA;

        /** The name used in the API, e.g. {@code "no_data"}. */
        public String key() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }
}
