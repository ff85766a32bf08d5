package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.steamtally.calc.plant.Component;

/**
 * Computed from the states alone, the first law closes exactly: with every flow solved from the
 * mass and adiabatic heater balances, heat added − heat rejected = net work, whatever the
 * measured values. Only rounding may remain.
 */
class FirstLawIdentityTest {

    /**
     * The sums run over some ten terms of order 1e8 W each, rounded at 1e-16 relative; after the
     * linear solve of the flows 1e-12 of the heat added is a generous bound on what rounding leaves.
     */
    private static final double RELATIVE_TOLERANCE = 1e-12;

    static Stream<Arguments> units() {
        return Stream.of(
                Arguments.of("reheat", ExampleUnits.reheat()),
                Arguments.of("regenerative", ExampleUnits.regenerative()),
                Arguments.of("regenerative, hotter main steam", ExampleUnits.regenerative().set("T_main_steam", 813.0)),
                Arguments.of("regenerative, more generator output", ExampleUnits.regenerative().set("P_gen", 80.5e6)),
                Arguments.of("regenerative, hotter feedwater", ExampleUnits.regenerative().set("T_feedwater", 477.0)));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("units")
    void heatAddedMinusHeatRejectedEqualsNetWorkFromStatesAlone(String name, UnitBuilder unit) {
        UnitResult result = unit.model().evaluate(unit.snapshot());
        CycleResult cycle = result.cycle();
        double added = cycle.heatAddedW().getAsDouble();
        double balance = added - cycle.heatRejectedW().getAsDouble() - cycle.netWorkW().getAsDouble();
        assertEquals(0.0, balance, RELATIVE_TOLERANCE * added, name);
        for (Component c : unit.unit().components()) {
            if (c instanceof Component.OpenFeedwaterHeater || c instanceof Component.ClosedFeedwaterHeater
                    || c instanceof Component.Mixer) {
                double energy = 0.0;
                for (String in : c.inlets()) {
                    energy += flowTimesEnthalpy(result, in);
                }
                for (String out : c.outlets()) {
                    energy -= flowTimesEnthalpy(result, out);
                }
                assertEquals(0.0, energy, RELATIVE_TOLERANCE * added, name + ", " + c.id());
            }
        }
    }

    private static double flowTimesEnthalpy(UnitResult result, String stateId) {
        StateResult s = Results.state(result, stateId);
        return s.massFlowKgPerS().getAsDouble() * s.enthalpyJPerKg().getAsDouble();
    }
}
