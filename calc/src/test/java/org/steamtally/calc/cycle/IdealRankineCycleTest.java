package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;
import org.steamtally.calc.plant.Component;

/**
 * The ideal Rankine cycle: saturated liquid out of the condenser, isentropic pump, heat addition at
 * the boiler pressure, isentropic expansion into the wet region. Each row of
 * ideal-rankine-cycles.csv is an invented cycle; the model's figures are compared with the same
 * cycle worked out here by hand with the independent {@code com.hummeling:if97} (forward equations
 * only, see {@link IndependentSteam}).
 */
class IdealRankineCycleTest {

    /**
     * 0.01 %: the two IF97 implementations agree to about 1e-9 in h; the pump work, a difference
     * of two liquid enthalpies of about 1e5 J/kg that differ by 1e4 J/kg, magnifies that tenfold.
     * What is left is far below 1e-4 and far above any error that matters to an operator.
     */
    private static final double RELATIVE_TOLERANCE = 1e-4;

    @ParameterizedTest(name = "{0}")
    @CsvFileSource(resources = "ideal-rankine-cycles.csv", numLinesToSkip = 1)
    void idealCycleFiguresMatchIndependentHandCalculation(String name, double boilerMPa, double mainSteamT,
                                                         double condenserKPa, double m) {
        double pb = boilerMPa * 1e6;
        double pc = condenserKPa * 1e3;
        // Independent hand calculation.
        double h1 = IndependentSteam.hLiquid(pc);
        double s1 = IndependentSteam.sLiquid(pc);
        double t2 = IndependentSteam.temperaturePS(pb, s1, IndependentSteam.tSat(pc) + 1.0);
        double h2 = IndependentSteam.h(pb, t2);
        boolean saturatedInlet = mainSteamT == 0.0;
        double h3 = saturatedInlet ? IndependentSteam.hVapour(pb) : IndependentSteam.h(pb, mainSteamT);
        double s3 = saturatedInlet ? IndependentSteam.sVapour(pb) : IndependentSteam.s(pb, mainSteamT);
        double x4 = IndependentSteam.qualityPS(pc, s3);
        double h4 = IndependentSteam.hWet(pc, x4);
        double turbineWork = m * (h3 - h4);
        double pumpWork = m * (h2 - h1);
        double heatAdded = m * (h3 - h2);
        double heatRejected = m * (h4 - h1);
        double net = turbineWork - pumpWork;
        double efficiency = net / heatAdded;
        double backWork = pumpWork / turbineWork;
        double heatRate = 3600.0 / efficiency;

        UnitBuilder b = new UnitBuilder("ideal")
                .saturatedLiquid("condensate", pc)
                .measured("feedwater", pb, t2);
        if (saturatedInlet) {
            b.saturatedVapour("main_steam", pb);
        } else {
            b.measured("main_steam", pb, mainSteamT);
        }
        b.flow("main_steam", m)
                .wet("exhaust", pc, x4)
                .ideal("exhaust_ideal", "main_steam", "exhaust")
                .ideal("feedwater_ideal", "condensate", "feedwater")
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust", java.util.List.of(),
                        Optional.of("exhaust_ideal")))
                .component(new Component.Condenser("condenser", java.util.List.of("exhaust"), "condensate",
                        Optional.empty()))
                .component(new Component.Pump("pump", "condensate", "feedwater", Optional.empty(),
                        Optional.of("feedwater_ideal")));
        UnitResult result = b.model().evaluate(b.snapshot());
        CycleResult cycle = result.cycle();

        assertRelative(efficiency, cycle.thermalEfficiency().getAsDouble(), "thermal efficiency");
        assertRelative(backWork, cycle.backWorkRatio().getAsDouble(), "back-work ratio");
        assertRelative(net, cycle.netWorkW().getAsDouble(), "net work");
        assertRelative(heatRate, cycle.heatRateKJPerKWh().getAsDouble(), "heat rate");
        assertRelative(heatAdded, cycle.heatAddedW().getAsDouble(), "heat added");
        assertRelative(heatRejected, cycle.heatRejectedW().getAsDouble(), "heat rejected");
        assertRelative(turbineWork, cycle.turbineWorkW().getAsDouble(), "turbine work");
        assertRelative(pumpWork, cycle.pumpWorkW().getAsDouble(), "pump work");
        for (ComponentResult c : result.components()) {
            assertTrue(c.valid(), c.id() + " " + c.reason());
            if (c.type().equals("turbine") || c.type().equals("pump")) {
                // Isentropic by construction: the ideal outlet is the outlet itself.
                assertEquals(1.0, c.isentropicEfficiency().getAsDouble(), RELATIVE_TOLERANCE, c.id());
                // No entropy is generated in an isentropic adiabatic machine; 1e-4 of its work bounds rounding.
                assertEquals(0.0, c.exergyDestructionW().getAsDouble(),
                        RELATIVE_TOLERANCE * Math.abs(c.workOutW().getAsDouble()), c.id());
            }
        }
        // The ideal cycle's mean-temperature efficiency is its thermal efficiency: all of its
        // irreversibility is outside it (1 − T̄_out/T̄_in = 1 − Q_out/Q_in when ΔS_in = ΔS_out).
        assertRelative(efficiency, cycle.meanTemperatureCarnotEfficiency().getAsDouble(), "mean-temperature Carnot");
        assertTrue(cycle.carnotEfficiency().getAsDouble() > efficiency, "Carnot bounds the cycle");
    }

    private static void assertRelative(double expected, double actual, String what) {
        assertEquals(expected, actual, RELATIVE_TOLERANCE * Math.abs(expected), what);
    }
}
