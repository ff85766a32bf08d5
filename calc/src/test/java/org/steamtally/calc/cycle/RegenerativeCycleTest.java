package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.calc.cycle.ExampleUnits.COOLING_WATER_PRESSURE;
import static org.steamtally.calc.cycle.ExampleUnits.GENERATOR_EFFICIENCY;

import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The regenerative example of {@link ExampleUnits#regenerative()} (one closed heater cascading its
 * drain into one open heater) against the same cycle worked out here by hand with the
 * independent {@code com.hummeling:if97}: the heater balances solved in closed form, the exhaust
 * enthalpy from the generator output.
 */
class RegenerativeCycleTest {

    /** As in {@link ReheatCycleTest}: sums of enthalpies that agree to about 1e-9 between the implementations. */
    private static final double RELATIVE_TOLERANCE = 1e-7;

    private static UnitBuilder unit;
    private static UnitResult result;

    private static double m;
    private static double mHigh;
    private static double mLow;
    private static double mCondensate;
    private static double hMain;
    private static double hHigh;
    private static double hLow;
    private static double hExhaust;
    private static double hCondensate;
    private static double hCondensatePumped;
    private static double hDeaerator;
    private static double hFeedPumped;
    private static double hFeed;
    private static double hDrain;

    @BeforeAll
    static void evaluate() {
        unit = ExampleUnits.regenerative();
        result = unit.model().evaluate(unit.snapshot());
        m = unit.value("m_main_steam");
        hMain = IndependentSteam.h(10e6, 793.15);
        hHigh = IndependentSteam.h(1.8e6, 562.0);
        hLow = IndependentSteam.h(0.45e6, 429.0);
        hCondensate = IndependentSteam.hLiquid(8e3);
        hCondensatePumped = IndependentSteam.h(0.5e6, 314.8);
        hDeaerator = IndependentSteam.hLiquid(0.45e6);
        hFeedPumped = IndependentSteam.h(10.5e6, 422.8);
        hFeed = IndependentSteam.h(10.4e6, 475.0);
        hDrain = IndependentSteam.hLiquid(1.8e6);
        // Closed heater: m_high (h_high − h_drain) = m (h_feed − h_feed,pumped).
        mHigh = m * (hFeed - hFeedPumped) / (hHigh - hDrain);
        // Open heater: m_low + m_c + m_high = m and m_low h_low + m_c h_c,pumped + m_high h_drain = m h_deaerator.
        mLow = (m * hDeaerator - mHigh * hDrain - (m - mHigh) * hCondensatePumped) / (hLow - hCondensatePumped);
        mCondensate = m - mHigh - mLow;
        // Turbine against generator: m h_main − m_high h_high − m_low h_low − m_c h_exhaust = P / η_gen.
        double shaft = unit.value("P_gen") / GENERATOR_EFFICIENCY;
        hExhaust = (m * hMain - mHigh * hHigh - mLow * hLow - shaft) / mCondensate;
    }

    @Test
    void everyStateAndComponentIsValid() {
        result.states().forEach(s -> assertTrue(s.valid(), s.id() + ": " + s.reason()));
        result.components().forEach(c -> assertTrue(c.valid(), c.id() + ": " + c.reason()));
        Results.assertAllFinite(result);
    }

    @Test
    void flowsMatchHandSolvedHeaterBalances() {
        assertRelative(mHigh, Results.state(result, "hp_extraction").massFlowKgPerS().getAsDouble(), "m high");
        assertRelative(mHigh, Results.state(result, "heater_drain").massFlowKgPerS().getAsDouble(), "m drain");
        assertRelative(mLow, Results.state(result, "lp_extraction").massFlowKgPerS().getAsDouble(), "m low");
        assertRelative(mCondensate, Results.state(result, "exhaust").massFlowKgPerS().getAsDouble(), "m exhaust");
        assertRelative(mCondensate, Results.state(result, "condensate_pumped").massFlowKgPerS().getAsDouble(),
                "m condensate");
        assertRelative(m, Results.state(result, "feedwater").massFlowKgPerS().getAsDouble(), "m feedwater");
    }

    @Test
    void exhaustEnthalpyFollowsFromGeneratorOutput() {
        assertRelative(hExhaust, Results.state(result, "exhaust").enthalpyJPerKg().getAsDouble(), "h exhaust");
    }

    @Test
    void cycleFiguresMatchHandCalculation() {
        double turbine = m * hMain - mHigh * hHigh - mLow * hLow - mCondensate * hExhaust;
        double pumps = mCondensate * (hCondensatePumped - hCondensate) + m * (hFeedPumped - hDeaerator);
        double added = m * (hMain - hFeed);
        double rejected = mCondensate * (hExhaust - hCondensate);
        double net = turbine - pumps;
        CycleResult cycle = result.cycle();
        assertRelative(added, cycle.heatAddedW().getAsDouble(), "heat added");
        assertRelative(rejected, cycle.heatRejectedW().getAsDouble(), "heat rejected");
        assertRelative(turbine, cycle.turbineWorkW().getAsDouble(), "turbine work");
        assertRelative(pumps, cycle.pumpWorkW().getAsDouble(), "pump work");
        assertRelative(net, cycle.netWorkW().getAsDouble(), "net work");
        assertRelative(net / added, cycle.thermalEfficiency().getAsDouble(), "thermal efficiency");
        assertRelative(pumps / turbine, cycle.backWorkRatio().getAsDouble(), "back-work ratio");
        assertRelative(3600.0 * added / net, cycle.heatRateKJPerKWh().getAsDouble(), "heat rate");
    }

    @Test
    void condenserAgainstCoolingWaterIsTheOnlyComponentClosure() {
        double duty = unit.value("m_cw") * (IndependentSteam.h(COOLING_WATER_PRESSURE, unit.value("T_cw_out"))
                - IndependentSteam.h(COOLING_WATER_PRESSURE, unit.value("T_cw_in")));
        double rejected = mCondensate * (hExhaust - hCondensate);
        double scale = m * (hMain - hFeed);
        assertEquals(rejected - duty, Results.closure(result, "condenser+cooling_water").residualW(),
                RELATIVE_TOLERANCE * scale, "condenser against cooling water");
        // With the turbine fixed by the generator, the cycle residual is the condenser's.
        assertEquals(rejected - duty, Results.closure(result, "cycle").residualW(), RELATIVE_TOLERANCE * scale, "cycle");
        assertEquals(2, result.closure().size(), result.closure().toString());
    }

    @Test
    void adiabaticHeatersDestroyExergyButCarryNoHeatOrWork() {
        for (String id : new String[] {"deaerator", "hp_heater"}) {
            ComponentResult heater = Results.component(result, id);
            assertEquals(0.0, heater.heatInW().getAsDouble(), 0.0, id);
            assertEquals(0.0, heater.workOutW().getAsDouble(), 0.0, id);
            // Mixing and heat transfer across a finite temperature difference generate entropy.
            assertTrue(heater.exergyDestructionW().getAsDouble() > 0.0, id);
        }
    }

    private static void assertRelative(double expected, double actual, String what) {
        assertEquals(expected, actual, RELATIVE_TOLERANCE * Math.abs(expected), what);
    }
}
