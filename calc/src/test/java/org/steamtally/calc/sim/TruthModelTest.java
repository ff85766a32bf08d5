package org.steamtally.calc.sim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.HashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.steam.Steam;

class TruthModelTest {

    /** The truth closes to rounding: 1e-6 σ is under a watt here, a modelling slip is far larger. */
    private static final double Z_TOLERANCE = 1e-6;

    private static UnitResult evaluate(TruthPoint truth) {
        return CycleModel.compile("fernholm", SimpleUnit.unit()).evaluate(
                Snapshot.allGood(Instant.parse("2026-12-02T00:00:00Z"), "unit1", truth.sensorValuesSi()));
    }

    @ParameterizedTest(name = "load {0}, cooling water {1} K")
    @CsvSource({"1.0, 0.0", "0.7, 3.0", "0.4, -6.0", "1.05, 8.0"})
    void noiseFreeTruthClosesEveryCheckedBalance(double load, double shift) {
        TruthPoint truth = SimpleUnit.truth().at(new OperatingConditions(load, shift));
        UnitResult result = evaluate(truth);
        // cycle, turbine+generator, feed_pump+motor, boiler+fuel; the cooling water fixes the exhaust
        assertEquals(4, result.closure().size(), result.closure().toString());
        for (ClosureResult c : result.closure()) {
            assertTrue(Math.abs(c.z()) < Z_TOLERANCE, c.id() + ": z " + c.z());
        }
        assertEquals(truth.figures().netWorkW(), result.cycle().netWorkW().orElseThrow(), 1e-9 * truth.figures().netWorkW());
        assertEquals(truth.figures().heatAddedW(), result.cycle().heatAddedW().orElseThrow(),
                1e-9 * truth.figures().heatAddedW());
    }

    @Test
    void cycleModelFindsTheDesignIsentropicEfficiencies() {
        UnitResult result = evaluate(SimpleUnit.truth().atDesign());
        Map<String, Double> eta = new HashMap<>();
        for (ComponentResult c : result.components()) {
            c.isentropicEfficiency().ifPresent(v -> eta.put(c.id(), v));
        }
        // Both sides use IF97 h(p, s) for the ideal outlet; the rest is rounding.
        assertEquals(0.86, eta.get("turbine"), 1e-9);
        assertEquals(0.80, eta.get("feed_pump"), 1e-9);
    }

    @Test
    void partLoadPressuresFollowTheConeLawWithTemperaturesHeld() {
        TruthModel model = SimpleUnit.truth();
        TruthPoint half = model.at(new OperatingConditions(0.5, 0.0));
        // Hand derivation: with the exhaust pressure unchanged (no cooling-water shift),
        // p_in² = p_out² + L² (p_in,d² − p_out,d²) at L = 0.5.
        double pOut = SimpleUnit.EXHAUST_PA;
        double expected = Math.sqrt(pOut * pOut + 0.25 * (SimpleUnit.MAIN_STEAM_PA * SimpleUnit.MAIN_STEAM_PA - pOut * pOut));
        assertEquals(expected, half.valueSi("PT-101"), 1e-6 * expected);
        assertEquals(SimpleUnit.EXHAUST_PA, half.valueSi("PT-301"), 1e-9 * SimpleUnit.EXHAUST_PA);
        assertEquals(SimpleUnit.MAIN_STEAM_K, half.valueSi("TT-101"), 0.0);
        assertEquals(0.5 * SimpleUnit.MAIN_FLOW, half.valueSi("FT-101"), 1e-12);
        assertEquals(SimpleUnit.FEED_PA, half.valueSi("PT-401"), 0.0);
        assertEquals(SimpleUnit.COOLING_FLOW, half.valueSi("FT-501"), 0.0);
        assertTrue(half.valueSi("JT-001") < 0.55 * model.atDesign().valueSi("JT-001"),
                "generator output falls at least in proportion to the flow");
    }

    @Test
    void warmerCoolingWaterRaisesTheCondenserSaturationTemperatureByTheSameAmount() {
        TruthModel model = SimpleUnit.truth();
        double tsatDesign = Steam.saturationTemperature(SimpleUnit.EXHAUST_PA);
        TruthPoint warm = model.at(new OperatingConditions(1.0, 5.0));
        // IF97 eqs. 30 and 31 are each other's exact inverse; 1e-6 K covers their rounding.
        assertEquals(tsatDesign + 5.0, Steam.saturationTemperature(warm.valueSi("PT-301")), 1e-6);
        assertEquals(SimpleUnit.COOLING_IN_K + 5.0, warm.valueSi("TT-501"), 1e-12);
        assertTrue(warm.valueSi("TT-502") > warm.valueSi("TT-501"));
    }

    @Test
    void turbineCasingLossShowsAsTheKnownResidualOfTheGeneratorAndCycleBalances() {
        double fraction = 0.002;
        TruthModel model = TruthModel.of(SimpleUnit.unit(), SimpleUnit.design().turbineCasingLossFraction(fraction).build());
        TruthPoint truth = model.atDesign();
        double loss = fraction * truth.figures().turbineWorkW();
        assertEquals(loss, truth.expectedResidualsW().get("turbine+generator"), 1e-9 * loss);
        assertEquals(loss, truth.expectedResidualsW().get("cycle"), 1e-9 * loss);
        for (ClosureResult c : evaluate(truth).closure()) {
            double z = (c.residualW() - truth.expectedResidualsW().getOrDefault(c.id(), 0.0)) / c.sigmaW();
            assertTrue(Math.abs(z) < Z_TOLERANCE, c.id() + ": residual " + c.residualW() + " W");
        }
    }

    @Test
    void pumpOutletWithAGivenTemperatureKeepsItsDesignRiseOverTheInlet() {
        DesignPoint full = SimpleUnit.design().build();
        Map<String, Double> eta = new HashMap<>(full.isentropicEfficiencies());
        eta.remove("feed_pump");
        Map<String, Double> values = new HashMap<>(full.sensorValuesSi());
        values.put("TT-401", 313.0);
        TruthModel model = TruthModel.of(SimpleUnit.unit(),
                new DesignPoint(full.referenceFlows(), values, eta, full.flowMeters(), 0.0));
        assertEquals(313.0, model.atDesign().valueSi("TT-401"), 1e-9);
        TruthPoint warm = model.at(new OperatingConditions(1.0, 5.0));
        // The condensate is saturated at the condenser pressure, whose saturation temperature rose 5 K.
        assertEquals(313.0 + 5.0, warm.valueSi("TT-401"), 1e-6);
        for (ClosureResult c : evaluate(warm).closure()) {
            assertTrue(Math.abs(c.z()) < Z_TOLERANCE, c.id() + ": z " + c.z());
        }
    }

    @Test
    void missingDesignPressureIsNamed() {
        DesignPoint full = SimpleUnit.design().build();
        Map<String, Double> values = new HashMap<>(full.sensorValuesSi());
        values.remove("PT-401");
        TruthModelException e = assertThrows(TruthModelException.class, () -> TruthModel.of(SimpleUnit.unit(),
                new DesignPoint(full.referenceFlows(), values, full.isentropicEfficiencies(), full.flowMeters(), 0.0)));
        assertTrue(e.getMessage().contains("\"feedwater\": design value of its pressure sensor \"PT-401\" is missing"),
                e.getMessage());
    }

    @Test
    void outletWithNeitherTemperatureNorEfficiencyIsNamed() {
        DesignPoint full = SimpleUnit.design().build();
        Map<String, Double> eta = new HashMap<>(full.isentropicEfficiencies());
        eta.remove("feed_pump");
        TruthModelException e = assertThrows(TruthModelException.class, () -> TruthModel.of(SimpleUnit.unit(),
                new DesignPoint(full.referenceFlows(), full.sensorValuesSi(), eta, full.flowMeters(), 0.0)));
        assertTrue(e.getMessage().contains("\"TT-401\" or the isentropic efficiency of \"feed_pump\""), e.getMessage());
    }

    @Test
    void designValueOfADerivedSensorIsRefused() {
        TruthModelException e = assertThrows(TruthModelException.class,
                () -> TruthModel.of(SimpleUnit.unit(), SimpleUnit.design().value("JT-001", 40e6).build()));
        assertTrue(e.getMessage().contains("sensor \"JT-001\" follows from the balances"), e.getMessage());
    }

    @Test
    void flowOfAnUnknownStateIsRefused() {
        TruthModelException e = assertThrows(TruthModelException.class,
                () -> TruthModel.of(SimpleUnit.unit(), SimpleUnit.design().flow("hotwell", 3.0).build()));
        assertTrue(e.getMessage().contains("\"hotwell\", which is not a flowing state"), e.getMessage());
        assertFalse(e.problems().isEmpty());
    }
}
