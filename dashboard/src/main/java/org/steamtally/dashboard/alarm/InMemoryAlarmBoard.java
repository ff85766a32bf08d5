package org.steamtally.dashboard.alarm;

import java.time.Duration;
import java.time.InstantSource;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.function.Consumer;
import org.steamtally.dashboard.push.LiveResults;

/**
 * An {@link AlarmBoard} held in memory: alarms are raised by {@link #raise}, operator actions change
 * their state, and a shelved alarm whose time is up returns as unacknowledged the next time the board
 * is read. For tests and demonstrations until the alarm engine is connected.
 */
public final class InMemoryAlarmBoard implements AlarmBoard {

    /** Longest shelving an operator may ask for: one shift (common practice: a shelf outlasts no shift). */
    public static final Duration MAX_SHELVE = Duration.ofHours(12);

    private final InstantSource clock;
    private final Map<String, AlarmView> alarms = new LinkedHashMap<>();
    private final List<Consumer<AlarmView>> listeners = new CopyOnWriteArrayList<>();

    public InMemoryAlarmBoard(InstantSource clock) {
        this.clock = clock;
    }

    /** Puts an alarm on the board (or replaces one with the same id) and tells the listeners. */
    public void raise(AlarmView alarm) {
        synchronized (this) {
            alarms.put(alarm.id(), alarm);
        }
        notifyListeners(alarm);
    }

    @Override
    public synchronized List<AlarmView> list(String unitId) {
        returnExpiredShelves();
        List<AlarmView> out = new ArrayList<>();
        for (AlarmView a : alarms.values()) {
            if (a.unitId().equals(unitId)) {
                out.add(a);
            }
        }
        out.sort(Comparator.comparing(AlarmView::priority).thenComparing(AlarmView::since, Comparator.reverseOrder()));
        return out;
    }

    @Override
    public AlarmView acknowledge(String alarmId, String user) {
        AlarmView changed;
        synchronized (this) {
            AlarmView a = find(alarmId);
            changed = switch (a.state()) {
                case UNACKNOWLEDGED -> a.with(AlarmView.State.ACKNOWLEDGED, Optional.empty(), Optional.empty());
                case RETURNED_UNACKNOWLEDGED -> null;
                default -> throw new AlarmActionException("alarm '" + alarmId + "' is " + a.state().key()
                        + "; only an unacknowledged alarm can be acknowledged");
            };
            if (changed == null) {
                // Acknowledging an alarm that has returned to normal clears it (ISA-18.2 state C to A).
                alarms.remove(alarmId);
                changed = a.with(AlarmView.State.ACKNOWLEDGED, Optional.empty(), Optional.empty());
            } else {
                alarms.put(alarmId, changed);
            }
        }
        notifyListeners(changed);
        return changed;
    }

    @Override
    public AlarmView shelve(String alarmId, Duration duration, String reason, String user) {
        if (duration.isNegative() || duration.isZero() || duration.compareTo(MAX_SHELVE) > 0) {
            throw new AlarmActionException("shelve duration must be more than 0 and at most " + MAX_SHELVE.toHours()
                    + " h, was " + duration.toMinutes() + " min");
        }
        if (reason == null || reason.isBlank()) {
            throw new AlarmActionException("shelving needs a reason");
        }
        AlarmView changed;
        synchronized (this) {
            AlarmView a = find(alarmId);
            if (a.state() == AlarmView.State.SHELVED || a.state() == AlarmView.State.OUT_OF_SERVICE
                    || a.state() == AlarmView.State.SUPPRESSED_BY_DESIGN) {
                throw new AlarmActionException("alarm '" + alarmId + "' is " + a.state().key() + " and cannot be shelved");
            }
            changed = a.with(AlarmView.State.SHELVED, Optional.of(clock.instant().plus(duration)),
                    Optional.of(reason.strip()));
            alarms.put(alarmId, changed);
        }
        notifyListeners(changed);
        return changed;
    }

    @Override
    public AlarmView unshelve(String alarmId, String user) {
        AlarmView changed;
        synchronized (this) {
            AlarmView a = find(alarmId);
            if (a.state() != AlarmView.State.SHELVED) {
                throw new AlarmActionException("alarm '" + alarmId + "' is " + a.state().key() + ", not shelved");
            }
            changed = a.with(AlarmView.State.UNACKNOWLEDGED, Optional.empty(), Optional.empty());
            alarms.put(alarmId, changed);
        }
        notifyListeners(changed);
        return changed;
    }

    @Override
    public LiveResults.Subscription subscribe(String unitId, Consumer<AlarmView> listener) {
        Consumer<AlarmView> filtered = a -> {
            if (a.unitId().equals(unitId)) {
                listener.accept(a);
            }
        };
        listeners.add(filtered);
        return () -> listeners.remove(filtered);
    }

    private AlarmView find(String alarmId) {
        AlarmView a = alarms.get(alarmId);
        if (a == null) {
            throw new UnknownAlarmException(alarmId);
        }
        return a;
    }

    private void returnExpiredShelves() {
        var now = clock.instant();
        alarms.replaceAll((id, a) -> a.state() == AlarmView.State.SHELVED && !a.shelvedUntil().orElseThrow().isAfter(now)
                ? a.with(AlarmView.State.UNACKNOWLEDGED, Optional.empty(), Optional.empty())
                : a);
    }

    private void notifyListeners(AlarmView a) {
        for (Consumer<AlarmView> l : listeners) {
            l.accept(a);
        }
    }
}
