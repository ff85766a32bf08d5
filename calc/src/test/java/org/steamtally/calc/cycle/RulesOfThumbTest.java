package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.Component;

/**
 * Sanity checks against rules of thumb of the trade. These are common practice, not published
 * values: they catch a result that is wrong by a factor, not by a percent.
 */
class RulesOfThumbTest {

    @Test
    void pumpWorkIsAboutOnePercentOfTurbineWorkInASimpleCycle() {
        // Common practice: in a simple subcritical Rankine cycle the feed pump takes about 1 % of
        // the turbine's work (0.3 % to 3 %), the liquid's specific volume being so small.
        UnitBuilder simple = new UnitBuilder("simple")
                .saturatedLiquid("condensate", 10e3)
                .measured("feedwater", 10.5e6, 320.0)
                .measured("main_steam", 10e6, 773.15)
                .flow("main_steam", 50.0)
                .wet("exhaust", 10e3, 0.88)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of(), Optional.empty()))
                .component(new Component.Condenser("condenser", List.of("exhaust"), "condensate", Optional.empty()))
                .component(new Component.Pump("pump", "condensate", "feedwater", Optional.empty(), Optional.empty()));
        double ratio = simple.model().evaluate(simple.snapshot()).cycle().backWorkRatio().getAsDouble();
        assertTrue(ratio > 0.003 && ratio < 0.03, "back-work ratio " + ratio);
    }

    @Test
    void condenserSaturationTemperatureIsAFewKelvinAboveCoolingWaterOutlet() {
        // Common practice: a surface condenser runs with its saturation temperature some 3 K to
        // 10 K above the cooling-water outlet (the terminal temperature difference).
        for (UnitBuilder unit : List.of(ExampleUnits.reheat(), ExampleUnits.regenerative())) {
            UnitResult result = unit.model().evaluate(unit.snapshot());
            double tSat = Results.state(result, "condensate").temperatureK().getAsDouble();
            double difference = tSat - unit.value("T_cw_out");
            assertTrue(difference > 2.0 && difference < 10.0, unit.unit().id() + ": " + difference + " K");
        }
    }

    @Test
    void turbineExhaustIsWetButNotTooWet() {
        // Common practice: a condensing turbine's exhaust quality lies around 0.85 to 0.95; below
        // about 0.85 blade erosion limits operation.
        for (UnitBuilder unit : List.of(ExampleUnits.reheat(), ExampleUnits.regenerative())) {
            UnitResult result = unit.model().evaluate(unit.snapshot());
            double x = Results.state(result, "exhaust").quality().getAsDouble();
            assertTrue(x > 0.85 && x < 0.96, unit.unit().id() + ": x = " + x);
        }
    }
}
