package org.steamtally.dashboard.view;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

class TsDiagramTest {

    @Test
    void anIsobarBelowTheCriticalPressureIsFlatAtItsSaturationTemperature() {
        // T_s(10 MPa) = 584.149488 K and T_s(0.1 MPa) = 372.755919 K: IAPWS R7-97(2012), Table 35.
        for (double[] row : new double[][] {{10e6, 584.149488}, {0.1e6, 372.755919}}) {
            List<TsDiagram.Point> pts = TsDiagram.isobar(row[0]).points();
            long atSaturation = pts.stream().filter(p -> Math.abs(p.temperatureK() - row[1]) < 1e-6).count();
            // The table prints nine digits; IF97's own inverse agrees to far better than a micro-kelvin.
            assertEquals(2, atSaturation, "liquid and vapour ends of the two-phase segment at " + row[0] + " Pa");
            for (int i = 1; i < pts.size(); i++) {
                assertTrue(pts.get(i).entropyJPerKgK() > pts.get(i - 1).entropyJPerKgK(),
                        "entropy rises along the isobar with temperature");
            }
        }
    }

    @Test
    void theDomeRisesOnTheLiquidSideAndFallsOnTheVapourSide() {
        List<TsDiagram.Point> dome = TsDiagram.dome();
        int top = dome.size() / 2;
        for (int i = 1; i < top; i++) {
            assertTrue(dome.get(i).temperatureK() > dome.get(i - 1).temperatureK());
        }
        // s'' at the triple point, 9.155 kJ/(kg K): IAPWS R7-97(2012) region 2 at 611.657 Pa, 273.16 K (recalled
        // from memory as the familiar steam-table value 9.1555; tolerance covers the last digit).
        assertEquals(9155.5, dome.get(dome.size() - 1).entropyJPerKgK(), 1.0);
    }

    @Test
    void pressuresCloserThanTheGapDrawAsOneLine() {
        assertEquals(List.of(10e6, 8.1e3), TsDiagram.distinctPressures(List.of(8e3, 10e6, 9.5e6, 8.1e3), 0.08));
    }

    @Test
    void anIsobarOutsideTheFormulationIsRefusedWithItsValue() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> TsDiagram.isobar(200e6));
        assertTrue(e.getMessage().contains("2.0E8 Pa"), e.getMessage());
    }
}
