package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.junit.jupiter.api.Test;

/** The reconciliation's verdict as the engine takes it: bad values are refused by name. */
class AlarmInputTest {

    @Test
    void suspectWithoutAPositiveUncertaintyIsRefusedNamingTheSensor() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new SuspectInput("FT-101", 2.0, 0.0, 4.0, List.of()));
        assertTrue(e.getMessage().contains("FT-101") && e.getMessage().contains("sigma 0.0"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> new SuspectInput("FT-101", Double.NaN, 1.0, 4.0, List.of()));
        assertThrows(IllegalArgumentException.class, () -> new SuspectInput(" ", 1.0, 1.0, 4.0, List.of()));
    }

    @Test
    void verdictWithANegativeRedundancyOrAChiSquaredThatIsNotANumberIsRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new ReconciliationInput(1.0, 12.6, -1, List.of()));
        assertTrue(e.getMessage().contains("-1"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> new ReconciliationInput(Double.NaN, 12.6, 6, List.of()));
        assertThrows(IllegalArgumentException.class, () -> new ReconciliationInput(1.0, 0.0, 6, List.of()));
    }

    @Test
    void withoutRedundancyTheGlobalTestCannotFail() {
        assertFalse(new ReconciliationInput(0.0, 0.0, 0, List.of()).globalTestFails());
        assertTrue(new ReconciliationInput(13.0, 12.6, 6, List.of()).globalTestFails());
    }
}
