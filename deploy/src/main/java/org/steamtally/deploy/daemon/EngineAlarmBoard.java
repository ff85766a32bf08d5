package org.steamtally.deploy.daemon;

import java.time.Duration;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.Consumer;
import java.util.function.Function;
import org.steamtally.calc.alarm.AlarmEngine;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmRecord;
import org.steamtally.calc.alarm.AlarmState;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.dashboard.alarm.AlarmActionException;
import org.steamtally.dashboard.alarm.AlarmBoard;
import org.steamtally.dashboard.alarm.AlarmView;
import org.steamtally.dashboard.alarm.UnknownAlarmException;
import org.steamtally.dashboard.push.LiveResults;

/**
 * The dashboard's alarm board over the units' alarm engines. An alarm's id on the board is the
 * engine's id with the unit after an {@code @} ({@code closure:cycle@unit3}), since engine ids are
 * unique only within a unit. Actions go to the unit's {@link UnitMonitor}, which runs them on the
 * unit's thread, stores the event and saves the state.
 *
 * <p>A unit's window-channel alarms are on the board beside its per-snapshot ones, with their
 * outside id ({@code window:suspect:TT-311@unit3}) and a text that says they are about the window
 * mean; their actions go to the window channel's engine.
 */
public final class EngineAlarmBoard implements AlarmBoard {

    private static final char SEPARATOR = '@';

    private final Map<String, UnitMonitor> units = new LinkedHashMap<>();
    private final Map<String, List<Consumer<AlarmView>>> listeners = new ConcurrentHashMap<>();

    public EngineAlarmBoard(List<UnitMonitor> monitors) {
        for (UnitMonitor m : monitors) {
            units.put(m.unitId(), m);
            m.onAlarmChange(changed -> {
                for (AlarmRecord r : changed) {
                    // The board's view has no normal state: a return to normal shows as the alarm
                    // leaving the list, which the page learns from its next listing.
                    view(m, r).ifPresent(v -> listeners.getOrDefault(m.unitId(), List.of()).forEach(l -> l.accept(v)));
                }
            });
            m.onWindowAlarmChange(changed -> {
                for (AlarmRecord r : changed) {
                    windowView(m, r).ifPresent(v -> listeners.getOrDefault(m.unitId(), List.of())
                            .forEach(l -> l.accept(v)));
                }
            });
        }
    }

    /** The board id of alarm {@code alarmId} of unit {@code unitId}. */
    public static String boardId(String unitId, String alarmId) {
        return alarmId + SEPARATOR + unitId;
    }

    @Override
    public List<AlarmView> list(String unitId) {
        UnitMonitor m = units.get(unitId);
        if (m == null) {
            return List.of();
        }
        List<AlarmView> out = new ArrayList<>();
        for (AlarmRecord r : m.alarms()) {
            view(m, r).ifPresent(out::add);
        }
        for (AlarmRecord r : m.windowAlarms()) {
            windowView(m, r).ifPresent(out::add);
        }
        out.sort(Comparator.comparing(AlarmView::priority).thenComparing(AlarmView::since, Comparator.reverseOrder()));
        return out;
    }

    @Override
    public AlarmView acknowledge(String alarmId, String user) {
        return act(alarmId, (engine, id) -> engine.acknowledge(id, user));
    }

    @Override
    public AlarmView shelve(String alarmId, Duration duration, String reason, String user) {
        return act(alarmId, (engine, id) -> engine.shelve(id, duration, user, reason));
    }

    @Override
    public AlarmView unshelve(String alarmId, String user) {
        return act(alarmId, (engine, id) -> engine.unshelve(id, user));
    }

    @Override
    public LiveResults.Subscription subscribe(String unitId, Consumer<AlarmView> listener) {
        List<Consumer<AlarmView>> list = listeners.computeIfAbsent(unitId, k -> new CopyOnWriteArrayList<>());
        list.add(listener);
        return () -> list.remove(listener);
    }

    private interface Action {
        AlarmEvent apply(AlarmEngine engine, String engineId);
    }

    private AlarmView act(String boardId, Action action) {
        int at = boardId.lastIndexOf(SEPARATOR);
        UnitMonitor m = at < 0 ? null : units.get(boardId.substring(at + 1));
        if (m == null) {
            throw new UnknownAlarmException(boardId);
        }
        String outsideId = boardId.substring(0, at);
        boolean inWindow = WindowChannel.isWindowId(outsideId);
        String engineId = inWindow ? WindowChannel.engineId(outsideId) : outsideId;
        List<AlarmRecord> known = inWindow ? m.windowAlarms() : m.alarms();
        if (known.stream().noneMatch(r -> r.id().equals(engineId))) {
            throw new UnknownAlarmException(boardId);
        }
        Function<AlarmEngine, AlarmEvent> f = engine -> action.apply(engine, engineId);
        AlarmRecord after;
        try {
            after = inWindow ? m.actOnWindow(f) : m.act(f);
        } catch (org.steamtally.calc.alarm.AlarmActionException e) {
            throw new AlarmActionException(inWindow ? "window channel: " + e.getMessage() : e.getMessage());
        }
        return (inWindow ? windowView(m, after) : view(m, after)).orElseThrow(() -> new AlarmActionException("alarm " + boardId
                + " returned to normal; there is nothing more to do with it"));
    }

    /** The dashboard's form of an engine record; empty in the normal state, which the board does not list. */
    static Optional<AlarmView> view(UnitMonitor m, AlarmRecord r) {
        return view(m, r, r.id(), r.text());
    }

    /** {@link #view} of a window-channel record: its outside id and a text saying it is of the window mean. */
    static Optional<AlarmView> windowView(UnitMonitor m, AlarmRecord r) {
        return view(m, r, UnitMonitor.windowAlarmId(r.id()), m.windowAlarmText(r));
    }

    private static Optional<AlarmView> view(UnitMonitor m, AlarmRecord r, String alarmId, String text) {
        AlarmView.State state = switch (r.state()) {
            case NORMAL -> null;
            case ACTIVE_UNACKNOWLEDGED -> AlarmView.State.UNACKNOWLEDGED;
            case ACTIVE_ACKNOWLEDGED -> AlarmView.State.ACKNOWLEDGED;
            case RETURNED_UNACKNOWLEDGED -> AlarmView.State.RETURNED_UNACKNOWLEDGED;
            case SHELVED -> AlarmView.State.SHELVED;
            case SUPPRESSED_BY_DESIGN -> AlarmView.State.SUPPRESSED_BY_DESIGN;
            case OUT_OF_SERVICE -> AlarmView.State.OUT_OF_SERVICE;
        };
        if (state == null) {
            return Optional.empty();
        }
        AlarmView.Priority priority = switch (r.priority()) {
            case URGENT, HIGH -> AlarmView.Priority.HIGH;
            case MEDIUM -> AlarmView.Priority.MEDIUM;
            case LOW -> AlarmView.Priority.LOW;
        };
        Optional<String> sensor = r.suspect().map(s -> s.sensorId());
        if (sensor.isEmpty() && (r.kind() == AlarmKind.STALE_SENSOR || r.kind() == AlarmKind.OUT_OF_RANGE
                || r.kind() == AlarmKind.FROZEN_SENSOR || r.kind() == AlarmKind.ERRATIC_SENSOR)) {
            sensor = Optional.of(r.id().substring(r.kind().idPrefix().length()));
        }
        OptionalDouble bias = r.suspect().map(s -> OptionalDouble.of(s.biasSi())).orElse(OptionalDouble.empty());
        Optional<String> biasUnit = r.suspect().flatMap(s -> m.unit().sensor(s.sensorId()))
                .map(Sensor::quantity).map(q -> q.siUnit());
        if (bias.isEmpty()) {
            biasUnit = Optional.empty();
        }
        // For an equivalence set, the balances of the sensor named; the alarm text names the rest.
        List<String> balances = r.suspect().map(s -> m.balancesOf(s.sensorId())).orElse(List.of());
        return Optional.of(new AlarmView(boardId(m.unitId(), alarmId), m.unitId(), priority, state, text,
                r.stateSince(), sensor, bias, biasUnit, balances, r.shelf().map(s -> s.until()),
                r.shelf().map(s -> s.reason())));
    }
}
