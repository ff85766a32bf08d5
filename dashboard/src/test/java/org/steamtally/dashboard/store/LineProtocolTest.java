package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import org.junit.jupiter.api.Test;

/**
 * Points as line protocol. Escaping rules from the InfluxDB 1.x line-protocol reference ("Special
 * characters"): in tag keys, tag values and field keys escape commas, equals signs and spaces; in
 * measurements commas and spaces; in string field values double quotes and backslashes.
 */
class LineProtocolTest {

    @Test
    void tagsFieldsAndTimestampFollowTheProtocol() {
        Point p = new Point(Measurement.COMPONENTS, "fern holm", "unit,1", "pump=2", 1_795_932_000_250L,
                "pump", 0.0, -1.6e6, null, 2.9e5, false, "state \"x\" is invalid \\ here");
        assertEquals("components,site=fern\\ holm,unit=unit\\,1,component=pump\\=2 type=\"pump\",heat_in_W=0.0,"
                + "work_out_W=-1600000.0,exergy_destruction_W=290000.0,valid=false,"
                + "reason=\"state \\\"x\\\" is invalid \\\\ here\" 1795932000250", LineProtocol.line(p));
    }

    @Test
    void integersCarryTheirSuffixAndTheWholeUnitPointHasNoSensorTag() {
        Point p = new Point(Measurement.RECONCILIATION, "fernholm", "unit1", "", 1000L,
                7.5, 11.07, 5L, true, null, null, null, null, null);
        assertEquals("reconciliation,site=fernholm,unit=unit1 chi2=7.5,chi2_limit=11.07,redundancy=5i,passed=true 1000",
                LineProtocol.line(p));
    }

    @Test
    void theWindowVerdictIsOneLineWithoutIdTagAndAbsentFieldsLeftOut() {
        Point p = new Point(Measurement.WINDOW_RECONCILIATION, "fernholm", "unit3", null, 1795932000250L,
                50.0, 50L, "passed", true, 4.2, 11.07, 4.2 / 11.07, 5L, null);
        assertEquals("window_reconciliation,site=fernholm,unit=unit3 length_s=50.0,samples=50i,status=\"passed\","
                + "passed=true,chi2=4.2,chi2_limit=11.07,chi2_ratio=" + (4.2 / 11.07) + ",redundancy=5i 1795932000250",
                LineProtocol.line(p));
    }

    @Test
    void aPointWithoutFieldsHasNoLine() {
        assertNull(LineProtocol.line(new Point(Measurement.READINGS, "s", "u", "PT-1", 0L, null, null)));
    }
}
