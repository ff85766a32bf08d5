package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.calc.cycle.ExampleUnits.BOILER_EFFICIENCY;
import static org.steamtally.calc.cycle.ExampleUnits.COOLING_WATER_PRESSURE;
import static org.steamtally.calc.cycle.ExampleUnits.GENERATOR_EFFICIENCY;
import static org.steamtally.calc.cycle.ExampleUnits.HEATING_VALUE;
import static org.steamtally.calc.cycle.ExampleUnits.MOTOR_EFFICIENCY;

import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The reheat example of {@link ExampleUnits#reheat()} against the same cycle worked out here by
 * hand with the independent {@code com.hummeling:if97} (forward equations only).
 */
class ReheatCycleTest {

    /**
     * The two IF97 implementations agree to about 1e-9 in h (see the cross-check of the steam
     * package); the figures here are sums and differences of a few such enthalpies, so 1e-7
     * relative leaves a wide margin over rounding and catches any wrong term of a balance.
     */
    private static final double RELATIVE_TOLERANCE = 1e-7;

    private static UnitBuilder unit;
    private static UnitResult result;

    // Independent hand calculation (SI).
    private static double m;
    private static double hMain;
    private static double hCold;
    private static double hHot;
    private static double hCondensate;
    private static double hFeed;
    private static double hExhaust;
    private static double coolingDuty;

    @BeforeAll
    static void evaluate() {
        unit = ExampleUnits.reheat();
        result = unit.model().evaluate(unit.snapshot());
        m = unit.value("m_main_steam");
        hMain = IndependentSteam.h(14e6, 808.0);
        hCold = IndependentSteam.h(3.2e6, 596.0);
        hHot = IndependentSteam.h(3.0e6, 808.0);
        hCondensate = IndependentSteam.hLiquid(9e3);
        hFeed = IndependentSteam.h(15e6, 318.3);
        coolingDuty = unit.value("m_cw") * (IndependentSteam.h(COOLING_WATER_PRESSURE, unit.value("T_cw_out"))
                - IndependentSteam.h(COOLING_WATER_PRESSURE, unit.value("T_cw_in")));
        // Condenser: m (h_exhaust − h_condensate) = cooling-water duty.
        hExhaust = hCondensate + coolingDuty / m;
    }

    private static double turbineWork() {
        return m * (hMain - hCold) + m * (hHot - hExhaust);
    }

    private static double pumpWork() {
        return m * (hFeed - hCondensate);
    }

    private static double heatAdded() {
        return m * (hMain - hFeed) + m * (hHot - hCold);
    }

    @Test
    void everyStateAndComponentIsValid() {
        result.states().forEach(s -> assertTrue(s.valid(), s.id() + ": " + s.reason()));
        result.components().forEach(c -> assertTrue(c.valid(), c.id() + ": " + c.reason()));
        Results.assertAllFinite(result);
    }

    @Test
    void exhaustEnthalpyFollowsFromCoolingWaterDuty() {
        StateResult exhaust = Results.state(result, "exhaust");
        assertRelative(hExhaust, exhaust.enthalpyJPerKg().getAsDouble(), "h exhaust");
        double x = (hExhaust - hCondensate) / (IndependentSteam.hVapour(9e3) - hCondensate);
        assertRelative(x, exhaust.quality().getAsDouble(), "exhaust quality");
        assertEquals(Phase.TWO_PHASE, exhaust.phase().get());
    }

    @Test
    void cycleFiguresMatchHandCalculation() {
        CycleResult cycle = result.cycle();
        double net = turbineWork() - pumpWork();
        double eta = net / heatAdded();
        assertRelative(heatAdded(), cycle.heatAddedW().getAsDouble(), "heat added");
        assertRelative(coolingDuty, cycle.heatRejectedW().getAsDouble(), "heat rejected");
        assertRelative(turbineWork(), cycle.turbineWorkW().getAsDouble(), "turbine work");
        assertRelative(pumpWork(), cycle.pumpWorkW().getAsDouble(), "pump work");
        assertRelative(net, cycle.netWorkW().getAsDouble(), "net work");
        assertRelative(eta, cycle.thermalEfficiency().getAsDouble(), "thermal efficiency");
        assertRelative(pumpWork() / turbineWork(), cycle.backWorkRatio().getAsDouble(), "back-work ratio");
        assertRelative(3600.0 / eta, cycle.heatRateKJPerKWh().getAsDouble(), "heat rate");
        double tMin = IndependentSteam.tSat(9e3);
        assertRelative(1.0 - tMin / 808.0, cycle.carnotEfficiency().getAsDouble(), "Carnot efficiency");
        double sMain = IndependentSteam.s(14e6, 808.0);
        double sFeed = IndependentSteam.s(15e6, 318.3);
        double sCold = IndependentSteam.s(3.2e6, 596.0);
        double sHot = IndependentSteam.s(3.0e6, 808.0);
        double sCondensate = IndependentSteam.sLiquid(9e3);
        double xExhaust = (hExhaust - hCondensate) / (IndependentSteam.hVapour(9e3) - hCondensate);
        double sExhaust = sCondensate + xExhaust * (IndependentSteam.sVapour(9e3) - sCondensate);
        double meanIn = heatAdded() / (m * (sMain - sFeed) + m * (sHot - sCold));
        double meanOut = coolingDuty / (m * (sExhaust - sCondensate));
        assertRelative(1.0 - meanOut / meanIn, cycle.meanTemperatureCarnotEfficiency().getAsDouble(),
                "mean-temperature Carnot efficiency");
    }

    @Test
    void componentHeatAndWorkCarryTheSignConvention() {
        assertRelative(m * (hMain - hFeed), Results.component(result, "boiler").heatInW().getAsDouble(), "boiler");
        assertRelative(m * (hHot - hCold), Results.component(result, "reheater").heatInW().getAsDouble(), "reheater");
        assertRelative(m * (hMain - hCold), Results.component(result, "hp").workOutW().getAsDouble(), "hp");
        assertRelative(m * (hHot - hExhaust), Results.component(result, "lp").workOutW().getAsDouble(), "lp");
        assertRelative(-pumpWork(), Results.component(result, "pump").workOutW().getAsDouble(), "pump");
        assertRelative(-coolingDuty, Results.component(result, "condenser").heatInW().getAsDouble(), "condenser");
        assertRelative(unit.value("P_gen"), Results.component(result, "generator").workOutW().getAsDouble(),
                "generator");
    }

    @Test
    void isentropicEfficienciesMatchHandCalculation() {
        double sMain = IndependentSteam.s(14e6, 808.0);
        double tIdeal = IndependentSteam.temperaturePS(3.2e6, sMain, 580.0);
        double hpIdeal = IndependentSteam.h(3.2e6, tIdeal);
        assertRelative((hMain - hCold) / (hMain - hpIdeal),
                Results.component(result, "hp").isentropicEfficiency().getAsDouble(), "hp efficiency");
        double xIdeal = IndependentSteam.qualityPS(9e3, IndependentSteam.s(3.0e6, 808.0));
        double lpIdeal = IndependentSteam.hWet(9e3, xIdeal);
        assertRelative((hHot - hExhaust) / (hHot - lpIdeal),
                Results.component(result, "lp").isentropicEfficiency().getAsDouble(), "lp efficiency");
    }

    @Test
    void closureResidualsMatchHandCalculation() {
        double generatorShaft = unit.value("P_gen") / GENERATOR_EFFICIENCY;
        double fuelHeat = unit.value("m_fuel") * HEATING_VALUE * BOILER_EFFICIENCY;
        double motorWork = unit.value("P_pump") * MOTOR_EFFICIENCY;
        // The residuals are differences of terms of order 1e8 W: the tolerance is relative to those.
        double scale = heatAdded();
        assertEquals(turbineWork() - generatorShaft, Results.closure(result, "hp+lp+generator").residualW(),
                RELATIVE_TOLERANCE * scale, "turbines against generator");
        assertEquals(heatAdded() - fuelHeat, Results.closure(result, "boiler+fuel").residualW(),
                RELATIVE_TOLERANCE * scale, "boiler and reheater against fuel");
        assertEquals(pumpWork() - motorWork, Results.closure(result, "pump+motor").residualW(),
                RELATIVE_TOLERANCE * scale, "pump against motor");
        assertEquals(fuelHeat - coolingDuty - (generatorShaft - motorWork), Results.closure(result, "cycle").residualW(),
                RELATIVE_TOLERANCE * scale, "cycle");
        // The cooling water fixed the exhaust: its balance closes identically and is not reported.
        assertFalse(Results.hasClosure(result, "condenser+cooling_water"));
        for (ClosureResult c : result.closure()) {
            assertEquals(c.residualW() / c.sigmaW(), c.z(), 1e-12 * Math.abs(c.z()) + 1e-15, c.id());
        }
    }

    private static void assertRelative(double expected, double actual, String what) {
        assertEquals(expected, actual, RELATIVE_TOLERANCE * Math.abs(expected), what);
    }
}
