package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/** The settings' defaults and the checks that keep a definition usable for its kind. */
class AlarmSettingsTest {

    @ParameterizedTest
    @EnumSource(AlarmKind.class)
    void everyKindHasAnEnabledDefault(AlarmKind kind) {
        assertTrue(AlarmSettings.DEFAULTS.definition(kind).enabled());
    }

    @Test
    void closureDefaultIsThreeWithHalfDeadbandTenAndThirtySeconds() {
        AlarmDefinition d = AlarmSettings.DEFAULTS.definition(AlarmKind.CLOSURE);
        assertEquals(3.0, d.limit());
        assertEquals(0.5, d.deadband());
        assertEquals(Duration.ofSeconds(10), d.onDelay());
        assertEquals(Duration.ofSeconds(30), d.offDelay());
    }

    @Test
    void overrideAppliesToItsAlarmOnly() {
        AlarmDefinition four = AlarmSettings.CLOSURE_DEFAULT.withLimit(4.0);
        AlarmSettings s = new AlarmSettings(AlarmSettings.defaultKinds(), Map.of("closure:cycle", four),
                AlarmSettings.MAX_SHELVE_DEFAULT);
        assertEquals(four, s.definitionOf(AlarmKind.CLOSURE, "closure:cycle"));
        assertEquals(AlarmSettings.CLOSURE_DEFAULT, s.definitionOf(AlarmKind.CLOSURE, "closure:boiler+fuel"));
    }

    @Test
    void disabledAlarmIsNeverCreated() {
        AlarmSettings s = new AlarmSettings(AlarmSettings.defaultKinds(),
                Map.of("stale:PT-1", AlarmSettings.STALE_DEFAULT.withEnabled(false)), AlarmSettings.MAX_SHELVE_DEFAULT);
        AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), s, new TestClock());
        assertTrue(engine.alarm("stale:PT-1").isEmpty());
        assertTrue(engine.alarm("range:PT-1").isPresent());
    }

    @Test
    void deadbandAtOrAboveTheLimitIsRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> AlarmSettings.CLOSURE_DEFAULT.withDeadband(3.0));
        assertTrue(e.getMessage().contains("deadband 3.0") && e.getMessage().contains("never clear"), e.getMessage());
    }

    @Test
    void negativeDelayIsRefused() {
        assertThrows(IllegalArgumentException.class,
                () -> AlarmSettings.CLOSURE_DEFAULT.withDelays(Duration.ofSeconds(-1), Duration.ZERO));
    }

    @Test
    void limitOnAYesNoKindIsRefusedNamingTheKind() {
        var kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.STALE_SENSOR, AlarmSettings.STALE_DEFAULT.withLimit(2.0));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new AlarmSettings(kinds, Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT));
        assertTrue(e.getMessage().startsWith("stale_sensor: "), e.getMessage());
    }

    @Test
    void overrideWithAnIdOfNoKindIsRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new AlarmSettings(AlarmSettings.defaultKinds(), Map.of("cycle", AlarmSettings.CLOSURE_DEFAULT),
                        AlarmSettings.MAX_SHELVE_DEFAULT));
        assertTrue(e.getMessage().contains("\"cycle\""), e.getMessage());
    }

    @Test
    void rangeDeadbandOfHalfTheSpanIsRefused() {
        var kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.OUT_OF_RANGE, AlarmSettings.OUT_OF_RANGE_DEFAULT.withDeadband(0.5));
        assertThrows(IllegalArgumentException.class, () -> new AlarmSettings(kinds, Map.of(), Duration.ofHours(1)));
    }

    @Test
    void idPrefixesNameTheirKinds() {
        assertEquals(List.of(AlarmKind.CLOSURE, AlarmKind.GLOBAL_TEST, AlarmKind.SUSPECT_SENSOR,
                        AlarmKind.STALE_SENSOR, AlarmKind.OUT_OF_RANGE, AlarmKind.CALCULATION_INVALID),
                List.of("closure:cycle", AlarmKind.GLOBAL_TEST_ID, "suspect:FT-101", "stale:TT-101", "range:PT-1",
                        "invalid:state:main_steam").stream().map(id -> AlarmKind.ofId(id).orElseThrow()).toList());
        assertTrue(AlarmKind.ofId("stale:").isEmpty());
    }
}
