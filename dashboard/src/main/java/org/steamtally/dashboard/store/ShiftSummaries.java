package org.steamtally.dashboard.store;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import java.util.concurrent.Executor;

/**
 * Builds shift summaries from a backend's primitive queries, the same way for every adapter.
 *
 * <p>Energy is integrated over one-minute buckets aligned to the shift's start: each bucket with at
 * least one sample counts its mean power times its length (clipped to the summarised range), so
 * short gaps in the data are bridged by the minute's mean and longer gaps count as no data.
 */
final class ShiftSummaries {

    /** Integration step for energy and the unit of data coverage. */
    static final Duration BUCKET = Duration.ofMinutes(1);

    /** Joules per megawatt-hour: 1 MWh = 10^6 W × 3600 s. */
    static final double J_PER_MWH = 3.6e9;

    private static final String HEAT_ADDED = "heat_added_W";
    private static final String NET_WORK = "net_work_W";
    private static final String EFFICIENCY = "thermal_efficiency";
    private static final String HEAT_RATE = "heat_rate_kJ_per_kWh";

    private ShiftSummaries() {
    }

    /**
     * @param executor runs the closure statistics, the largest query, while the calling thread asks
     *                 the others
     */
    static ShiftSummary summarise(StoreBackend backend, Clock clock, Executor executor, String site, String unit,
            Shift shift) {
        Instant now = clock.instant();
        Instant until = shift.end().isAfter(now) ? (now.isAfter(shift.start()) ? now : shift.start()) : shift.end();
        Instant from = shift.start();
        CompletableFuture<List<ClosureStats>> closures = CompletableFuture.supplyAsync(
                () -> backend.closureStats(site, unit, from, until), executor);
        Map<String, List<Bucket>> b = backend.buckets(
                SeriesRef.cycle(site, unit, HEAT_ADDED, NET_WORK, EFFICIENCY, HEAT_RATE), from, until, BUCKET);
        double energyIn = energyMWh(b.get(HEAT_ADDED), until);
        double energyOut = energyMWh(b.get(NET_WORK), until);
        Set<Instant> coveredStarts = new HashSet<>();
        for (List<Bucket> l : b.values()) {
            for (Bucket k : l) {
                coveredStarts.add(k.start());
            }
        }
        Duration covered = Duration.ZERO;
        for (Instant s : coveredStarts) {
            covered = covered.plus(clippedLength(s, until));
        }
        List<SuspectSensor> suspects = backend.suspects(site, unit, from, until);
        Duration alarms = alarmsActive(backend, site, unit, from, until);
        List<ClosureStats> closureStats;
        try {
            closureStats = closures.join();
        } catch (CompletionException e) {
            if (e.getCause() instanceof RuntimeException r) {
                throw r;
            }
            throw e;
        }
        return new ShiftSummary(site, unit, shift, until, energyIn, energyOut,
                mean(b.get(EFFICIENCY)), min(b.get(EFFICIENCY)), mean(b.get(HEAT_RATE)), max(b.get(HEAT_RATE)),
                covered, closureStats, alarms,
                suspects.subList(0, Math.min(ShiftSummary.TOP_SUSPECTS, suspects.size())));
    }

    private static Duration clippedLength(Instant bucketStart, Instant until) {
        Instant end = bucketStart.plus(BUCKET);
        return Duration.between(bucketStart, end.isAfter(until) ? until : end);
    }

    private static double energyMWh(List<Bucket> buckets, Instant until) {
        double joules = 0.0;
        for (Bucket k : buckets) {
            joules += k.mean() * clippedLength(k.start(), until).toMillis() / 1000.0;
        }
        return joules / J_PER_MWH;
    }

    private static OptionalDouble mean(List<Bucket> buckets) {
        double sum = 0.0;
        long n = 0;
        for (Bucket k : buckets) {
            sum += k.mean() * k.count();
            n += k.count();
        }
        return n == 0 ? OptionalDouble.empty() : OptionalDouble.of(sum / n);
    }

    private static OptionalDouble min(List<Bucket> buckets) {
        return buckets.stream().mapToDouble(Bucket::min).min();
    }

    private static OptionalDouble max(List<Bucket> buckets) {
        return buckets.stream().mapToDouble(Bucket::max).max();
    }

    /**
     * Time in [from, until) during which at least one alarm is active: each alarm's state is carried
     * in from its last event before the range, then changed by each event in it.
     */
    static Duration alarmsActive(StoreBackend backend, String site, String unit, Instant from, Instant until) {
        Set<String> active = new HashSet<>();
        for (StoredAlarmEvent e : backend.lastAlarmEventsBefore(site, unit, from)) {
            if (e.active()) {
                active.add(e.alarmId());
            }
        }
        List<StoredAlarmEvent> events = new ArrayList<>(backend.alarmEvents(site, unit, from, until));
        events.sort(Comparator.comparing(StoredAlarmEvent::timestamp));
        long activeMs = 0;
        Instant t = from;
        for (StoredAlarmEvent e : events) {
            if (!active.isEmpty()) {
                activeMs += Duration.between(t, e.timestamp()).toMillis();
            }
            t = e.timestamp();
            if (e.active()) {
                active.add(e.alarmId());
            } else {
                active.remove(e.alarmId());
            }
        }
        if (!active.isEmpty()) {
            activeMs += Duration.between(t, until).toMillis();
        }
        return Duration.ofMillis(activeMs);
    }
}
