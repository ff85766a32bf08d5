package org.steamtally.dashboard.http;

import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import java.time.InstantSource;
import java.util.List;
import java.util.Objects;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.dashboard.alarm.AlarmBoard;
import org.steamtally.dashboard.push.LiveResults;
import org.steamtally.dashboard.security.AuditLog;
import org.steamtally.dashboard.security.UserAccount;

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
 */
public record DashboardSources(PlantDescription plant, LiveResults live, AlarmBoard alarms, List<UserAccount> users,
                               AuditLog audit, PrometheusMeterRegistry meters, InstantSource clock) {

    public DashboardSources {
        Objects.requireNonNull(plant, "plant");
        Objects.requireNonNull(live, "live");
        Objects.requireNonNull(alarms, "alarms");
        users = List.copyOf(users);
        Objects.requireNonNull(audit, "audit");
        Objects.requireNonNull(meters, "meters");
        Objects.requireNonNull(clock, "clock");
    }
}
