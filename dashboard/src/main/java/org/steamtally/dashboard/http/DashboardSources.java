package org.steamtally.dashboard.http;

import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import java.time.InstantSource;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.dashboard.alarm.AlarmBoard;
import org.steamtally.dashboard.push.LiveResults;
import org.steamtally.dashboard.security.AuditLog;
import org.steamtally.dashboard.security.UserAccount;
import org.steamtally.dashboard.store.ResultStore;
import org.steamtally.dashboard.store.ShiftCalendar;

/**
 * What the dashboard shows and whom it knows: the daemon's wiring builds this from its parts.
 *
 * @param plant   the plant description
 * @param live    the live results
 * @param alarms  the alarm board
 * @param users   the dashboard's users with their hashed passwords
 * @param audit   where operator actions are recorded
 * @param meters  the registry that {@code /metrics} exposes; the daemon's own meters go here too
 * @param clock   the time for sessions, rate limits and freshness
 * @param history the store behind trends, shift summaries and alarm history; without one those
 *                resources answer 501 and the live views work alone
 */
public record DashboardSources(PlantDescription plant, LiveResults live, AlarmBoard alarms, List<UserAccount> users,
                               AuditLog audit, PrometheusMeterRegistry meters, InstantSource clock,
                               Optional<History> history) {

    public DashboardSources {
        Objects.requireNonNull(plant, "plant");
        Objects.requireNonNull(live, "live");
        Objects.requireNonNull(alarms, "alarms");
        users = List.copyOf(users);
        Objects.requireNonNull(audit, "audit");
        Objects.requireNonNull(meters, "meters");
        Objects.requireNonNull(clock, "clock");
        Objects.requireNonNull(history, "history");
    }

    /** Sources without a store: trends, shift summaries and alarm history answer 501. */
    public DashboardSources(PlantDescription plant, LiveResults live, AlarmBoard alarms, List<UserAccount> users,
                            AuditLog audit, PrometheusMeterRegistry meters, InstantSource clock) {
        this(plant, live, alarms, users, audit, meters, clock, Optional.empty());
    }

    /** These sources with {@code store} behind the history views, its shifts cut by {@code shifts}. */
    public DashboardSources withStore(ResultStore store, ShiftCalendar shifts) {
        return new DashboardSources(plant, live, alarms, users, audit, meters, clock,
                Optional.of(new History(store, shifts)));
    }

    /**
     * The store the dashboard reads history from, and the site's shift pattern.
     *
     * @param store  the result store; the dashboard only queries it, its owner closes it
     * @param shifts the site's shifts, in the site's time zone
     */
    public record History(ResultStore store, ShiftCalendar shifts) {
        public History {
            Objects.requireNonNull(store, "store");
            Objects.requireNonNull(shifts, "shifts");
        }
    }
}
