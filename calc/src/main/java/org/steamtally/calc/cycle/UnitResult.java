package org.steamtally.calc.cycle;

import java.time.Instant;
import java.util.List;
import java.util.Objects;

/**
 * The result record of one snapshot of one unit: the contract shared by {@code replay}, the live API
 * and the store. Its JSON form uses snake_case names with the unit in the name; every field is
 * documented in docs/RESULTS.md.
 *
 * @param timestamp the snapshot's instant ({@code ts}, ISO-8601 UTC)
 * @param site      the site id
 * @param unit      the unit id
 */
public record UnitResult(
        Instant timestamp,
        String site,
        String unit,
        List<StateResult> states,
        List<ComponentResult> components,
        CycleResult cycle,
        List<ClosureResult> closure) {

    public UnitResult {
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(site, "site");
        Objects.requireNonNull(unit, "unit");
        states = List.copyOf(states);
        components = List.copyOf(components);
        Objects.requireNonNull(cycle, "cycle");
        closure = List.copyOf(closure);
    }
}
