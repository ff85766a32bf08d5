package org.steamtally.calc.alarm;

import java.time.Duration;
import java.time.Instant;
import java.time.InstantSource;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;

import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.signal.SensorSignal;
import org.steamtally.calc.signal.SignalCheck;
import org.steamtally.calc.signal.SignalReport;
import org.steamtally.calc.signal.SignalSettings;
import org.steamtally.calc.signal.SignalVerdict;

/**
 * The alarms of one unit: from each snapshot, its result record and the reconciliation's verdict to
 * the ISA-18.2 alarm states (ANSI/ISA-18.2-2016; IEC 62682), with every change of state returned as
 * an {@link AlarmEvent}. Pure logic: no I/O, time from the injected {@link InstantSource}, state
 * kept in memory and handed out as plain values ({@link #state()}, {@link #restore}).
 *
 * <p>Per alarm the condition passes a deadband, then the on- and off-delays, then the state machine:
 * <pre>
 * NORMAL                  --condition active--&gt; ACTIVE_UNACKNOWLEDGED
 * ACTIVE_UNACKNOWLEDGED   --acknowledge-------&gt; ACTIVE_ACKNOWLEDGED
 * ACTIVE_UNACKNOWLEDGED   --condition clears--&gt; RETURNED_UNACKNOWLEDGED
 * ACTIVE_ACKNOWLEDGED     --condition clears--&gt; NORMAL
 * RETURNED_UNACKNOWLEDGED --acknowledge-------&gt; NORMAL
 * RETURNED_UNACKNOWLEDGED --condition active--&gt; ACTIVE_UNACKNOWLEDGED
 * A to D, F, E            --shelve------------&gt; SHELVED (E again: a new period)
 * SHELVED                 --unshelve, expiry--&gt; by the condition: ACTIVE_UNACKNOWLEDGED or NORMAL
 * A to D                  --suppress----------&gt; SUPPRESSED_BY_DESIGN
 * SUPPRESSED_BY_DESIGN    --end suppression---&gt; by the condition
 * any but G               --remove------------&gt; OUT_OF_SERVICE
 * OUT_OF_SERVICE          --return------------&gt; by the condition
 * </pre>
 * "By the condition" means SUPPRESSED_BY_DESIGN while the kind is suppressed, else
 * ACTIVE_UNACKNOWLEDGED when the condition is active (the alarm is annunciated afresh) and NORMAL
 * when it is not. In E, F and G the condition is still followed, so the alarm returns in the right
 * state, but the state does not change.
 *
 * <p>Inputs that cannot be evaluated (a closure missing from the record, a sensor without a good
 * value for the range check, no reconciliation) keep the alarm as it is and cancel any change under
 * way; the stale and calculation-invalid alarms say why.
 *
 * <p>One cause, one alarm: when the unit as a whole goes silent (its {@code silent:unit} alarm's
 * condition is active: the limit's share of the sensors, by default all, without a good value), the
 * stale-sensor and calculation-invalid alarms, which then only repeat that cause, are suppressed by
 * design like a suppressed kind, and return to the state their condition calls for when the unit
 * reports again. To keep the journal from a flood, only the alarms an operator can see change with
 * an event: one that was annunciated (B to D) goes to F with a {@code suppress} event, one that
 * comes back active is annunciated afresh with an {@code end_suppression} event; the moves between
 * A and F are kept in the alarms' states and records but journaled once, by the silent-unit alarm's
 * own events. When the unit reports again, a suppressed alarm whose input has already returned
 * clears at once, its off-delay cut short: the delay keeps an annunciated alarm from chattering, and
 * this one was not annunciated.
 *
 * <p>Not thread-safe: one engine per unit, called from one thread (the unit's evaluation), operator
 * actions included. An evaluation without a change of state allocates nothing but the instant.
 */
public final class AlarmEngine {

    private final String unitId;
    private final AlarmSettings settings;
    private final InstantSource clock;

    private final Sensor[] sensors;
    private final Map<String, Sensor> sensorsById;
    private final Alarm[] stale;
    private final Alarm[] range;
    private final String[] stateIds;
    private final Alarm[] stateInvalid;
    private final String[] componentIds;
    private final Alarm[] componentInvalid;
    private final Alarm global;
    private final Alarm[] frozen;
    private final Alarm[] erratic;
    private final Map<String, Alarm> closures = new HashMap<>();
    private final List<Alarm> closureList = new ArrayList<>();
    private final Map<String, Alarm> suspects = new HashMap<>();
    private final List<Alarm> suspectList = new ArrayList<>();
    private final Map<String, Alarm> byId = new LinkedHashMap<>();
    /** The same alarms as {@code byId}, for loops without an iterator. */
    private final List<Alarm> all = new ArrayList<>();
    private final EnumMap<AlarmKind, String> suppressed = new EnumMap<>(AlarmKind.class);
    private final Alarm silent;
    /** Whether the stale-sensor and calculation-invalid alarms are suppressed because the unit is silent. */
    private boolean silenced;

    /** The suppression reason of the alarms a silent unit suppresses; restore tells them apart by it. */
    public static final String SILENT_UNIT_REASON = "the unit is silent (alarm " + AlarmKind.SILENT_UNIT_ID + ")";

    private int epoch;
    /** The events of the call under way; null until the first. */
    private List<AlarmEvent> events;

    /**
     * An engine for one unit, every alarm in {@link AlarmState#NORMAL}.
     *
     * @param unit     the unit's description: its sensors (in snapshot order), states and components
     * @param settings the plant's alarm settings
     * @param clock    the source of time for the delays, the shelves and the events
     */
    public AlarmEngine(UnitDescription unit, AlarmSettings settings, InstantSource clock) {
        this.unitId = unit.id();
        this.settings = Objects.requireNonNull(settings, "settings");
        this.clock = Objects.requireNonNull(clock, "clock");
        Instant now = clock.instant();
        sensors = unit.sensors().toArray(new Sensor[0]);
        sensorsById = unit.sensorsById();
        stale = new Alarm[sensors.length];
        range = new Alarm[sensors.length];
        for (int i = 0; i < sensors.length; i++) {
            stale[i] = create(AlarmKind.STALE_SENSOR, sensors[i].id(), false, now);
            range[i] = create(AlarmKind.OUT_OF_RANGE, sensors[i].id(), false, now);
        }
        List<StateDefinition> states = unit.states();
        stateIds = new String[states.size()];
        stateInvalid = new Alarm[states.size()];
        for (int j = 0; j < stateIds.length; j++) {
            stateIds[j] = states.get(j).id();
            stateInvalid[j] = create(AlarmKind.CALCULATION_INVALID, stateIds[j], true, now);
        }
        List<Component> components = unit.components();
        componentIds = new String[components.size()];
        componentInvalid = new Alarm[components.size()];
        for (int c = 0; c < componentIds.length; c++) {
            componentIds[c] = components.get(c).id();
            componentInvalid[c] = create(AlarmKind.CALCULATION_INVALID, componentIds[c], false, now);
        }
        global = create(AlarmKind.GLOBAL_TEST, "global", false, now);
        frozen = new Alarm[sensors.length];
        erratic = new Alarm[sensors.length];
        for (int i = 0; i < sensors.length; i++) {
            frozen[i] = create(AlarmKind.FROZEN_SENSOR, sensors[i].id(), false, now);
            erratic[i] = create(AlarmKind.ERRATIC_SENSOR, sensors[i].id(), false, now);
        }
        silent = create(AlarmKind.SILENT_UNIT, unitId, false, now);
    }

    /**
     * A signal check of a unit whose limits are the alarm settings' own: each sensor's frozen-value
     * limit is the limit of its {@code frozen:} alarm, in seconds, and its scatter factor that of its
     * {@code erratic:} alarm, so that the check's verdicts and the alarms agree.
     */
    public static SignalCheck signalCheck(UnitDescription unit, AlarmSettings settings, SignalSettings signal) {
        return new SignalCheck(unit, signal,
                id -> settings.definitionOf(AlarmKind.FROZEN_SENSOR, alarmId(AlarmKind.FROZEN_SENSOR, id)).limit(),
                id -> settings.definitionOf(AlarmKind.ERRATIC_SENSOR, alarmId(AlarmKind.ERRATIC_SENSOR, id)).limit());
    }

    /** The unit's id. */
    public String unitId() {
        return unitId;
    }

    /** The settings in force. */
    public AlarmSettings settings() {
        return settings;
    }

    // ---- alarm ids and creation

    /** The id of the alarm of a kind about a subject (closure, sensor, state or component id). */
    public static String alarmId(AlarmKind kind, String subject) {
        if (kind == AlarmKind.GLOBAL_TEST) {
            return AlarmKind.GLOBAL_TEST_ID;
        }
        return kind == AlarmKind.SILENT_UNIT ? AlarmKind.SILENT_UNIT_ID : kind.idPrefix() + subject;
    }

    /** The id of the calculation-invalid alarm of a state. */
    public static String stateInvalidId(String stateId) {
        return AlarmKind.CALCULATION_INVALID.idPrefix() + "state:" + stateId;
    }

    /** The id of the calculation-invalid alarm of a component. */
    public static String componentInvalidId(String componentId) {
        return AlarmKind.CALCULATION_INVALID.idPrefix() + "component:" + componentId;
    }

    /** A new alarm, or null when its definition disables it. */
    private Alarm create(AlarmKind kind, String subject, boolean aboutState, Instant now) {
        String id = kind == AlarmKind.CALCULATION_INVALID
                ? (aboutState ? stateInvalidId(subject) : componentInvalidId(subject))
                : alarmId(kind, subject);
        AlarmDefinition definition = settings.definitionOf(kind, id);
        if (!definition.enabled()) {
            return null;
        }
        Sensor sensor = kind == AlarmKind.SUSPECT_SENSOR || kind == AlarmKind.STALE_SENSOR
                || kind == AlarmKind.OUT_OF_RANGE || kind == AlarmKind.FROZEN_SENSOR || kind == AlarmKind.ERRATIC_SENSOR
                ? sensorsById.get(subject) : null;
        Alarm alarm = new Alarm(id, kind, subject, sensor, aboutState, definition, now);
        byId.put(id, alarm);
        all.add(alarm);
        if (kind == AlarmKind.CLOSURE) {
            closures.put(subject, alarm);
            closureList.add(alarm);
        } else if (kind == AlarmKind.SUSPECT_SENSOR) {
            suspects.put(subject, alarm);
            suspectList.add(alarm);
        }
        if (suppressionOf(kind) != null) {
            // Its first state, not a transition: an alarm of a suppressed kind begins suppressed.
            alarm.state = AlarmState.SUPPRESSED_BY_DESIGN;
        }
        return alarm;
    }

    /**
     * The alarm of an id, created when the id names an alarm this unit can have but has not needed
     * yet: a suspect of one of its sensors, or (when restoring, since closure ids come from the
     * cycle model) a closure; null when it cannot exist or is disabled.
     */
    private Alarm find(String alarmId, Instant now, boolean newClosure) {
        Alarm alarm = byId.get(alarmId);
        if (alarm != null) {
            return alarm;
        }
        AlarmKind kind = AlarmKind.ofId(alarmId).orElse(null);
        if (kind == AlarmKind.CLOSURE && newClosure) {
            return create(kind, alarmId.substring(kind.idPrefix().length()), false, now);
        }
        if (kind == AlarmKind.SUSPECT_SENSOR) {
            String sensor = alarmId.substring(kind.idPrefix().length());
            return sensorsById.containsKey(sensor) ? create(kind, sensor, false, now) : null;
        }
        return null;
    }

    private Alarm require(String alarmId, Instant now) {
        Objects.requireNonNull(alarmId, "alarmId");
        Alarm alarm = find(alarmId, now, false);
        if (alarm == null) {
            throw new AlarmActionException("unit " + unitId + " has no alarm \"" + alarmId + "\" (ids are "
                    + "closure:<closure id>, reconciliation:global, suspect:<sensor>, stale:<sensor>, "
                    + "range:<sensor>, invalid:state:<state>, invalid:component:<component>, frozen:<sensor>, "
                    + "erratic:<sensor>, " + AlarmKind.SILENT_UNIT_ID + "; a closure's alarm exists"
                + " once the closure has been computed; a disabled alarm has none)");
        }
        return alarm;
    }

    // ---- evaluation

    /** {@link #evaluate(Snapshot, UnitResult, Optional)} without a reconciliation. */
    public List<AlarmEvent> evaluate(Snapshot snapshot, UnitResult result) {
        return evaluate(snapshot, result, Optional.empty());
    }

    /**
     * Updates every alarm of the unit from one snapshot and its result record, and expires shelves
     * whose time is up.
     *
     * @param snapshot       the snapshot: sensor values and statuses, in the unit description's sensor order
     * @param result         the cycle model's result record of that snapshot
     * @param reconciliation the reconciliation's verdict; empty when it was not run
     * @return the events of the changes of state, in the order they happened; an empty immutable
     *         list when nothing changed
     * @throws IllegalArgumentException when the snapshot or record belongs to another unit or the
     *                                  snapshot has not one value per sensor; nothing is changed
     */
    public List<AlarmEvent> evaluate(Snapshot snapshot, UnitResult result, Optional<ReconciliationInput> reconciliation) {
        if (!snapshot.unitId().equals(unitId) || !result.unit().equals(unitId)) {
            throw new IllegalArgumentException("alarm engine of unit " + unitId + " was given snapshot of unit "
                    + snapshot.unitId() + " and result of unit " + result.unit());
        }
        if (snapshot.valuesSi().length != sensors.length) {
            throw new IllegalArgumentException("unit " + unitId + " has " + sensors.length + " sensors, snapshot has "
                    + snapshot.valuesSi().length + " values");
        }
        events = null;
        Instant now = clock.instant();
        long nowMs = now.toEpochMilli();
        expire(now);
        // Before the sensors: a unit that falls silent suppresses their alarms before they are raised.
        silentUnit(snapshot.status(), now, nowMs);
        sensors(snapshot, now, nowMs);
        closures(result.closure(), now, nowMs);
        validity(result, now, nowMs);
        if (reconciliation.isPresent()) {
            reconciliation(reconciliation.get(), now, nowMs);
        } else {
            hold(global, nowMs);
            for (int k = 0; k < suspectList.size(); k++) {
                suspectList.get(k).hold(nowMs);
            }
        }
        // After them: the suppressed alarms whose inputs are back have seen it before they return.
        if (silenced && (silent == null || !silent.condition)) {
            endSilence(now);
        }
        return drain();
    }

    /**
     * Nothing could be evaluated this time (the window channel withheld its verdict on a window that
     * was not representative): every alarm keeps its condition and drops any change under way, as
     * each alarm does when its own input is missing, so a missing verdict neither raises nor clears
     * one. Shelves whose time is up expire.
     *
     * @return the events of the changes of state (shelf expiry only), in order; an empty immutable
     *         list when nothing changed
     */
    public List<AlarmEvent> hold() {
        events = null;
        Instant now = clock.instant();
        expire(now);
        long nowMs = now.toEpochMilli();
        for (int k = 0; k < all.size(); k++) {
            all.get(k).hold(nowMs);
        }
        return drain();
    }

    /**
     * Updates the frozen-sensor and erratic-sensor alarms from a signal check of one snapshot, and
     * expires shelves whose time is up. A test that did not decide keeps its alarm as it is, as a
     * missing input does for the other kinds; the stale alarm says why.
     *
     * @param report the signal check's report, from {@link #signalCheck} with this engine's settings
     * @return the events of the changes of state, in order; an empty immutable list when nothing changed
     * @throws IllegalArgumentException when the report is of another unit or its sensors are not the
     *                                  unit's, in order; nothing is changed
     */
    public List<AlarmEvent> evaluateSignals(SignalReport report) {
        List<SensorSignal> list = report.sensors();
        if (!report.unitId().equals(unitId) || list.size() != sensors.length) {
            throw new IllegalArgumentException("alarm engine of unit " + unitId + " with " + sensors.length
                    + " sensors was given the signal report of unit " + report.unitId() + " with " + list.size());
        }
        for (int i = 0; i < sensors.length; i++) {
            if (!list.get(i).sensorId().equals(sensors[i].id())) {
                throw new IllegalArgumentException("unit " + unitId + ": signal report has sensor "
                        + list.get(i).sensorId() + " where the unit has " + sensors[i].id());
            }
        }
        events = null;
        Instant now = clock.instant();
        long nowMs = now.toEpochMilli();
        expire(now);
        for (int i = 0; i < sensors.length; i++) {
            SensorSignal s = list.get(i);
            Alarm f = frozen[i];
            if (f != null) {
                if (s.frozen() == SignalVerdict.NOT_DECIDED) {
                    f.noValue();
                    f.hold(nowMs);
                } else {
                    f.value(s.frozenS(), s.frozenLimitS());
                    if (f.observe(nowMs, f.above(s.frozenS(), s.frozenLimitS(), f.definition.deadband()))) {
                        conditionChanged(f, now);
                    }
                }
            }
            Alarm e = erratic[i];
            if (e != null) {
                if (s.scatter() == SignalVerdict.NOT_DECIDED) {
                    e.noValue();
                    e.hold(nowMs);
                } else {
                    // The deadband is a factor on the quantile, like the limit: scale it the same way.
                    double band = e.definition.deadband() * s.scatterLimit() / e.definition.limit();
                    e.value(s.scatterRatio(), s.scatterLimit());
                    if (e.observe(nowMs, e.above(s.scatterRatio(), s.scatterLimit(), band))) {
                        conditionChanged(e, now);
                    }
                }
            }
        }
        return drain();
    }

    private void silentUnit(Snapshot.SensorStatus[] status, Instant now, long nowMs) {
        if (silent == null || status.length == 0) {
            return;
        }
        int n = 0;
        for (Snapshot.SensorStatus s : status) {
            if (s != Snapshot.SensorStatus.GOOD) {
                n++;
            }
        }
        double share = (double) n / status.length;
        AlarmDefinition d = silent.definition;
        silent.silentSensors = n;
        silent.sensorCount = status.length;
        silent.value(share, d.limit());
        // Not Alarm.above: with the default limit 1.0 and no deadband, "above 1.0 less nothing" would
        // never hold, and the share cannot exceed 1.
        boolean on = share >= (silent.pending ? d.limit() - d.deadband() : d.limit());
        if (silent.observe(nowMs, on)) {
            conditionChanged(silent, now);
        }
        if (silent.condition && !silenced) {
            startSilence(now);
        }
    }

    /** Whether the silent-unit alarm suppresses alarms of this kind. */
    private static boolean silencedKind(AlarmKind kind) {
        return kind == AlarmKind.STALE_SENSOR || kind == AlarmKind.CALCULATION_INVALID;
    }

    /** Why alarms of a kind are suppressed by design now; null when they are not. */
    private String suppressionOf(AlarmKind kind) {
        String reason = suppressed.get(kind);
        if (reason == null && silenced && silencedKind(kind)) {
            return SILENT_UNIT_REASON;
        }
        return reason;
    }

    private void startSilence(Instant now) {
        silenced = true;
        for (int k = 0; k < all.size(); k++) {
            Alarm a = all.get(k);
            if (!silencedKind(a.kind) || !a.state.followsCondition()) {
                continue;
            }
            if (a.state == AlarmState.NORMAL) {
                // Not shown before or after: kept in the state, journaled by the silent-unit alarm.
                a.state = AlarmState.SUPPRESSED_BY_DESIGN;
                a.stateSince = now;
            } else {
                transition(a, AlarmState.SUPPRESSED_BY_DESIGN, AlarmStimulus.SUPPRESS, now, null, SILENT_UNIT_REASON);
            }
        }
    }

    private void endSilence(Instant now) {
        silenced = false;
        for (int k = 0; k < all.size(); k++) {
            Alarm a = all.get(k);
            if (!silencedKind(a.kind) || a.state != AlarmState.SUPPRESSED_BY_DESIGN || suppressed.containsKey(a.kind)) {
                continue;
            }
            if (a.condition && !a.pending) {
                // Its input is back and its off-delay running: it was not annunciated, so nothing can chatter.
                a.condition = false;
                a.pendingSinceMs = now.toEpochMilli();
            }
            AlarmState to = byCondition(a);
            if (to == AlarmState.NORMAL) {
                a.state = to;
                a.stateSince = now;
            } else {
                transition(a, to, AlarmStimulus.END_SUPPRESSION, now, null, null);
            }
        }
    }

    private void sensors(Snapshot snapshot, Instant now, long nowMs) {
        double[] values = snapshot.valuesSi();
        Snapshot.SensorStatus[] status = snapshot.status();
        for (int i = 0; i < sensors.length; i++) {
            Snapshot.SensorStatus s = status[i];
            Alarm a = stale[i];
            if (a != null) {
                a.status = s;
                if (a.observe(nowMs, s != Snapshot.SensorStatus.GOOD)) {
                    conditionChanged(a, now);
                }
            }
            Alarm r = range[i];
            if (r != null) {
                r.status = s;
                if (s != Snapshot.SensorStatus.GOOD) {
                    r.noValue();
                    r.hold(nowMs);
                    continue;
                }
                double v = values[i];
                Sensor sensor = sensors[i];
                boolean on;
                if (Double.isFinite(v)) {
                    double band = r.definition.deadband() * (sensor.rangeMaxSi() - sensor.rangeMinSi());
                    on = r.above(v, sensor.rangeMaxSi(), band) || r.above(-v, -sensor.rangeMinSi(), band);
                    r.value(v, v < sensor.rangeMinSi() ? sensor.rangeMinSi() : sensor.rangeMaxSi());
                } else {
                    on = true;
                    r.noValue();
                }
                if (r.observe(nowMs, on)) {
                    conditionChanged(r, now);
                }
            }
        }
    }

    private void closures(List<ClosureResult> list, Instant now, long nowMs) {
        int stamp = ++epoch;
        for (int k = 0; k < list.size(); k++) {
            ClosureResult c = list.get(k);
            Alarm a = closures.get(c.id());
            if (a == null) {
                if (closures.containsKey(c.id())) {
                    continue;
                }
                a = create(AlarmKind.CLOSURE, c.id(), false, now);
                if (a == null) {
                    closures.put(c.id(), null);
                    continue;
                }
            }
            a.seen = stamp;
            double lim = a.definition.limit();
            a.residualW = c.residualW();
            a.sigmaW = c.sigmaW();
            a.value(c.z(), lim);
            if (a.observe(nowMs, a.above(Math.abs(c.z()), lim, a.definition.deadband()))) {
                conditionChanged(a, now);
            }
        }
        for (int k = 0; k < closureList.size(); k++) {
            Alarm a = closureList.get(k);
            if (a.seen != stamp) {
                a.hold(nowMs);
            }
        }
    }

    private void validity(UnitResult result, Instant now, long nowMs) {
        List<StateResult> states = result.states();
        for (int j = 0; j < states.size(); j++) {
            StateResult s = states.get(j);
            Alarm a = j < stateIds.length && stateIds[j].equals(s.id()) ? stateInvalid[j]
                    : byId.get(stateInvalidId(s.id()));
            if (a != null) {
                a.reason = s.reason().orElse(null);
                if (a.observe(nowMs, !s.valid())) {
                    conditionChanged(a, now);
                }
            }
        }
        List<ComponentResult> components = result.components();
        for (int c = 0; c < components.size(); c++) {
            ComponentResult r = components.get(c);
            Alarm a = c < componentIds.length && componentIds[c].equals(r.id()) ? componentInvalid[c]
                    : byId.get(componentInvalidId(r.id()));
            if (a != null) {
                a.reason = r.reason().orElse(null);
                if (a.observe(nowMs, !r.valid())) {
                    conditionChanged(a, now);
                }
            }
        }
    }

    private void reconciliation(ReconciliationInput rec, Instant now, long nowMs) {
        if (global != null) {
            if (rec.redundancy() == 0) {
                global.noValue();
                global.hold(nowMs);
            } else {
                AlarmDefinition d = global.definition;
                global.value(rec.chi2(), d.limit() * rec.chi2Limit());
                if (global.observe(nowMs, global.above(rec.chi2() / rec.chi2Limit(), d.limit(), d.deadband()))) {
                    conditionChanged(global, now);
                }
            }
        }
        int stamp = ++epoch;
        List<SuspectInput> named = rec.suspects();
        for (int k = 0; k < named.size(); k++) {
            SuspectInput s = named.get(k);
            Alarm a = suspects.get(s.sensorId());
            if (a == null) {
                if (suspects.containsKey(s.sensorId())) {
                    continue;
                }
                a = create(AlarmKind.SUSPECT_SENSOR, s.sensorId(), false, now);
                if (a == null) {
                    suspects.put(s.sensorId(), null);
                    continue;
                }
            }
            a.seen = stamp;
            a.suspect = s;
            a.listed = true;
            double lim = a.definition.limit();
            a.value(s.testValue(), lim);
            if (a.observe(nowMs, a.above(Math.abs(s.testValue()), lim, a.definition.deadband()))) {
                conditionChanged(a, now);
            }
        }
        for (int k = 0; k < suspectList.size(); k++) {
            Alarm a = suspectList.get(k);
            if (a.seen != stamp) {
                a.listed = false;
                if (a.observe(nowMs, false)) {
                    conditionChanged(a, now);
                }
            }
        }
    }

    private static void hold(Alarm a, long nowMs) {
        if (a != null) {
            a.hold(nowMs);
        }
    }

    // ---- the state machine

    private void conditionChanged(Alarm a, Instant now) {
        AlarmState to = switch (a.state) {
            case NORMAL -> a.condition ? AlarmState.ACTIVE_UNACKNOWLEDGED : null;
            case ACTIVE_UNACKNOWLEDGED -> a.condition ? null : AlarmState.RETURNED_UNACKNOWLEDGED;
            case ACTIVE_ACKNOWLEDGED -> a.condition ? null : AlarmState.NORMAL;
            case RETURNED_UNACKNOWLEDGED -> a.condition ? AlarmState.ACTIVE_UNACKNOWLEDGED : null;
            case SHELVED, SUPPRESSED_BY_DESIGN, OUT_OF_SERVICE -> null;
        };
        if (to != null) {
            transition(a, to, a.condition ? AlarmStimulus.CONDITION_ACTIVE : AlarmStimulus.CONDITION_CLEARED, now,
                    null, null);
        }
    }

    /** The state an alarm returns to from E, F or G. */
    private AlarmState byCondition(Alarm a) {
        if (suppressionOf(a.kind) != null) {
            return AlarmState.SUPPRESSED_BY_DESIGN;
        }
        return a.condition ? AlarmState.ACTIVE_UNACKNOWLEDGED : AlarmState.NORMAL;
    }

    private AlarmEvent transition(Alarm a, AlarmState to, AlarmStimulus stimulus, Instant now, String user, String note) {
        AlarmState from = a.state;
        a.state = to;
        a.stateSince = now;
        if (to != AlarmState.SHELVED) {
            a.shelf = null;
        }
        if (to != AlarmState.OUT_OF_SERVICE) {
            a.removal = null;
        }
        AlarmEvent event = new AlarmEvent(now, unitId, a.id, a.kind, a.definition.priority(), from, to, stimulus,
                a.valueOrEmpty(), a.limitOrEmpty(), Optional.ofNullable(user),
                note == null || note.isBlank() ? Optional.empty() : Optional.of(note.strip()), AlarmText.of(a));
        if (events == null) {
            events = new ArrayList<>(4);
        }
        events.add(event);
        return event;
    }

    private List<AlarmEvent> drain() {
        List<AlarmEvent> out = events == null ? List.of() : events;
        events = null;
        return out;
    }

    private AlarmEvent single(AlarmEvent event) {
        events = null;
        return event;
    }

    // ---- shelves

    /**
     * Returns every shelved alarm whose shelf has expired to the state its condition calls for.
     * {@link #evaluate} does this first; call it on its own where snapshots can pause.
     *
     * @return the events, one per expired shelf
     */
    public List<AlarmEvent> expireShelves() {
        events = null;
        expire(clock.instant());
        return drain();
    }

    private void expire(Instant now) {
        for (int k = 0; k < all.size(); k++) {
            Alarm a = all.get(k);
            if (a.state == AlarmState.SHELVED && !now.isBefore(a.shelf.until())) {
                transition(a, byCondition(a), AlarmStimulus.SHELF_EXPIRED, now, null, null);
            }
        }
    }

    // ---- operator actions

    private static void given(String text, String what, String action, String alarmId) {
        if (text == null || text.isBlank()) {
            throw new AlarmActionException("to " + action + " alarm " + alarmId + ", the " + what + " must be given");
        }
    }

    private static AlarmActionException notAllowed(Alarm a, String action, String allowed) {
        return new AlarmActionException("alarm " + a.id + " is " + a.state.key() + ": cannot " + action
                + " it (possible in " + allowed + ")");
    }

    /** {@link #acknowledge(String, String, String)} without a note. */
    public AlarmEvent acknowledge(String alarmId, String user) {
        return acknowledge(alarmId, user, "");
    }

    /**
     * The operator has seen the alarm: active unacknowledged becomes active acknowledged, returned
     * unacknowledged becomes normal.
     *
     * @throws AlarmActionException in any other state, for an unknown alarm or without a user
     */
    public AlarmEvent acknowledge(String alarmId, String user, String note) {
        Instant now = clock.instant();
        given(user, "user", "acknowledge", alarmId);
        Alarm a = require(alarmId, now);
        AlarmState to = switch (a.state) {
            case ACTIVE_UNACKNOWLEDGED -> AlarmState.ACTIVE_ACKNOWLEDGED;
            case RETURNED_UNACKNOWLEDGED -> AlarmState.NORMAL;
            default -> throw notAllowed(a, "acknowledge", "active_unacknowledged or returned_unacknowledged");
        };
        return single(transition(a, to, AlarmStimulus.ACKNOWLEDGE, now, user.strip(), note));
    }

    /**
     * Sets an alarm aside for a time: it keeps following its condition but is not annunciated, and
     * returns by itself when the time is up. Shelving a shelved alarm starts a new period.
     *
     * @param duration how long, &gt; 0 and at most {@link AlarmSettings#maxShelve()}
     * @param user     who
     * @param reason   why; required, as ISA-18.2 requires shelving to be recorded
     * @throws AlarmActionException out of service, for an unknown alarm, a bad duration, or without
     *                              user or reason
     */
    public AlarmEvent shelve(String alarmId, Duration duration, String user, String reason) {
        Instant now = clock.instant();
        given(user, "user", "shelve", alarmId);
        given(reason, "reason", "shelve", alarmId);
        Objects.requireNonNull(duration, "duration");
        if (duration.isNegative() || duration.isZero() || duration.compareTo(settings.maxShelve()) > 0) {
            throw new AlarmActionException("alarm " + alarmId + " can be shelved for more than 0 s and at most "
                    + settings.maxShelve() + ", not " + duration);
        }
        Alarm a = require(alarmId, now);
        if (a.state == AlarmState.OUT_OF_SERVICE) {
            throw notAllowed(a, "shelve", "every state but out_of_service");
        }
        a.shelf = new Shelf(user.strip(), reason.strip(), now, now.plus(duration));
        return single(transition(a, AlarmState.SHELVED, AlarmStimulus.SHELVE, now, user.strip(), reason));
    }

    /** {@link #unshelve(String, String, String)} without a note. */
    public AlarmEvent unshelve(String alarmId, String user) {
        return unshelve(alarmId, user, "");
    }

    /**
     * Ends a shelf early; the alarm takes the state its condition calls for (an active condition is
     * annunciated afresh, unacknowledged).
     *
     * @throws AlarmActionException when not shelved, for an unknown alarm or without a user
     */
    public AlarmEvent unshelve(String alarmId, String user, String note) {
        Instant now = clock.instant();
        given(user, "user", "unshelve", alarmId);
        Alarm a = require(alarmId, now);
        if (a.state != AlarmState.SHELVED) {
            throw notAllowed(a, "unshelve", "shelved");
        }
        return single(transition(a, byCondition(a), AlarmStimulus.UNSHELVE, now, user.strip(), note));
    }

    /**
     * Takes an alarm out of service, e.g. while its instrument is repaired; a shelf ends with it.
     *
     * @throws AlarmActionException when already out of service, for an unknown alarm, or without user
     *                              or reason
     */
    public AlarmEvent removeFromService(String alarmId, String user, String reason) {
        Instant now = clock.instant();
        given(user, "user", "remove from service", alarmId);
        given(reason, "reason", "remove from service", alarmId);
        Alarm a = require(alarmId, now);
        if (a.state == AlarmState.OUT_OF_SERVICE) {
            throw notAllowed(a, "remove from service", "every state but out_of_service");
        }
        a.removal = new ServiceRemoval(user.strip(), reason.strip(), now);
        return single(transition(a, AlarmState.OUT_OF_SERVICE, AlarmStimulus.REMOVE_FROM_SERVICE, now,
                user.strip(), reason));
    }

    /** {@link #returnToService(String, String, String)} without a note. */
    public AlarmEvent returnToService(String alarmId, String user) {
        return returnToService(alarmId, user, "");
    }

    /**
     * Returns an alarm to service in the state its condition calls for.
     *
     * @throws AlarmActionException when not out of service, for an unknown alarm or without a user
     */
    public AlarmEvent returnToService(String alarmId, String user, String note) {
        Instant now = clock.instant();
        given(user, "user", "return to service", alarmId);
        Alarm a = require(alarmId, now);
        if (a.state != AlarmState.OUT_OF_SERVICE) {
            throw notAllowed(a, "return to service", "out_of_service");
        }
        return single(transition(a, byCondition(a), AlarmStimulus.RETURN_TO_SERVICE, now, user.strip(), note));
    }

    /**
     * Suppression by design: plant-state logic hides every alarm of a kind, e.g. the closure alarms
     * while the unit is shut down. Alarms in states A to D go to SUPPRESSED_BY_DESIGN; shelved and
     * out-of-service ones stay and go there when they return. Suppressing a suppressed kind changes
     * only the reason.
     *
     * @param reason why, for the journal
     * @return the events
     */
    public List<AlarmEvent> suppress(AlarmKind kind, String reason) {
        Objects.requireNonNull(kind, "kind");
        AlarmText.requireGiven(reason, "the reason for suppressing " + kind.key());
        Instant now = clock.instant();
        events = null;
        suppressed.put(kind, reason.strip());
        for (Alarm a : byId.values()) {
            if (a.kind == kind && a.state.followsCondition()) {
                transition(a, AlarmState.SUPPRESSED_BY_DESIGN, AlarmStimulus.SUPPRESS, now, null, reason);
            }
        }
        return drain();
    }

    /** Ends the suppression of a kind; its suppressed alarms take the state their condition calls for. */
    public List<AlarmEvent> endSuppression(AlarmKind kind) {
        Objects.requireNonNull(kind, "kind");
        Instant now = clock.instant();
        events = null;
        if (suppressed.remove(kind) == null) {
            return List.of();
        }
        for (Alarm a : byId.values()) {
            if (a.kind == kind && a.state == AlarmState.SUPPRESSED_BY_DESIGN) {
                AlarmState to = byCondition(a);
                if (to != AlarmState.SUPPRESSED_BY_DESIGN) {
                    // Else a silent unit still suppresses it: it stays, and nothing changed.
                    transition(a, to, AlarmStimulus.END_SUPPRESSION, now, null, null);
                }
            }
        }
        return drain();
    }

    // ---- views, snapshot and restore

    /** Every alarm the unit has so far, in the order they were created. */
    public List<AlarmRecord> alarms() {
        List<AlarmRecord> out = new ArrayList<>(byId.size());
        for (Alarm a : byId.values()) {
            out.add(a.record(Optional.ofNullable(suppressionOf(a.kind))));
        }
        return out;
    }

    /** One alarm, when the unit has it. */
    public Optional<AlarmRecord> alarm(String alarmId) {
        Alarm a = byId.get(alarmId);
        return a == null ? Optional.empty() : Optional.of(a.record(Optional.ofNullable(suppressionOf(a.kind))));
    }

    /** The whole state, as plain values for the store. */
    public AlarmEngineState state() {
        return new AlarmEngineState(unitId, clock.instant(), alarms());
    }

    /**
     * Puts back a state taken by {@link #state()}, e.g. after a restart: each alarm's state, shelf,
     * removal, condition and running delay as recorded. Shelves that expired meanwhile expire at the
     * next evaluation. A record for an alarm this unit cannot have (a sensor or state no longer in
     * the plant description, a disabled alarm) is left out and named in the result; all others are
     * restored. The settings in force stay in force.
     *
     * @return one line per record left out, naming the alarm and why; empty when all were restored
     * @throws IllegalArgumentException when the state is of another unit; nothing is changed
     */
    public List<String> restore(AlarmEngineState saved) {
        if (!saved.unitId().equals(unitId)) {
            throw new IllegalArgumentException("alarm engine of unit " + unitId + " cannot restore the state of unit "
                    + saved.unitId());
        }
        List<String> leftOut = new ArrayList<>();
        Instant now = clock.instant();
        events = null;
        for (AlarmRecord r : saved.alarms()) {
            Alarm a = find(r.id(), now, true);
            if (a == null) {
                leftOut.add("alarm " + r.id() + ": unit " + unitId + " has no such alarm under the present plant"
                        + " description and settings");
                continue;
            }
            a.state = r.state();
            a.stateSince = r.stateSince();
            a.condition = r.conditionActive();
            a.pending = r.pendingCondition();
            a.pendingSinceMs = r.pendingSince().toEpochMilli();
            a.shelf = r.shelf().orElse(null);
            a.removal = r.removal().orElse(null);
            a.hasValue = r.value().isPresent();
            a.value = r.value().orElse(0.0);
            a.hasLimit = r.limit().isPresent();
            a.limit = r.limit().orElse(0.0);
            a.restoredText = r.text();
            a.suspect = r.suspect().orElse(null);
            if (r.suppression().isPresent()
                    && !(silencedKind(a.kind) && r.suppression().get().equals(SILENT_UNIT_REASON))) {
                suppressed.putIfAbsent(a.kind, r.suppression().get());
            }
        }
        // The silent-unit suppression follows its alarm's restored condition, whatever the other records say.
        if (silent != null && silent.condition) {
            startSilence(now);
        } else {
            endSilence(now);
        }
        events = null;
        return leftOut;
    }
}
