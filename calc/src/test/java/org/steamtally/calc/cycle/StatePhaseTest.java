package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.Component;

/** Phase and saturation margin of each state, from its pressure and temperature. */
class StatePhaseTest {

    /** A supercritical once-through unit: main steam above the critical pressure. */
    private static UnitResult supercritical() {
        UnitBuilder b = new UnitBuilder("sc")
                .saturatedLiquid("condensate", 5e3)
                .measured("feedwater", 26e6, 310.0)
                .measured("main_steam", 25e6, 873.15)
                .flow("main_steam", 300.0)
                .wet("exhaust", 5e3, 0.86)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of(), Optional.empty()))
                .component(new Component.Condenser("condenser", List.of("exhaust"), "condensate", Optional.empty()))
                .component(new Component.Pump("pump", "condensate", "feedwater", Optional.empty(), Optional.empty()));
        return b.model().evaluate(b.snapshot());
    }

    @Test
    void aboveTheCriticalPointTheStateIsSupercriticalWithoutMargin() {
        StateResult main = Results.state(supercritical(), "main_steam");
        assertTrue(main.valid(), main.reason().toString());
        assertEquals(Phase.SUPERCRITICAL, main.phase().get());
        assertTrue(main.saturationMarginK().isEmpty());
        assertTrue(main.quality().isEmpty());
    }

    @Test
    void compressedLiquidAboveTheCriticalPressureIsLiquidWithoutMargin() {
        StateResult feed = Results.state(supercritical(), "feedwater");
        assertEquals(Phase.LIQUID, feed.phase().get());
        assertTrue(feed.saturationMarginK().isEmpty());
    }

    @Test
    void superheatAndSubcoolingArePositiveDistancesFromSaturation() {
        UnitBuilder unit = ExampleUnits.regenerative();
        UnitResult r = unit.model().evaluate(unit.snapshot());
        StateResult low = Results.state(r, "lp_extraction");
        assertEquals(Phase.VAPOUR, low.phase().get());
        // Independent saturation temperature: com.hummeling:if97; rounding of two IF97 eq. 31 values only.
        assertEquals(429.0 - IndependentSteam.tSat(0.45e6), low.saturationMarginK().getAsDouble(), 1e-9);
        StateResult feed = Results.state(r, "feedwater");
        assertEquals(Phase.LIQUID, feed.phase().get());
        assertEquals(IndependentSteam.tSat(10.4e6) - 475.0, feed.saturationMarginK().getAsDouble(), 1e-9);
        StateResult wet = Results.state(r, "exhaust");
        assertEquals(Phase.TWO_PHASE, wet.phase().get());
        assertEquals(0.0, wet.saturationMarginK().getAsDouble(), 0.0);
        assertTrue(wet.quality().isPresent());
        assertTrue(low.quality().isEmpty(), "no quality outside the two-phase region");
        StateResult ideal = Results.state(r, "exhaust_ideal");
        assertTrue(ideal.massFlowKgPerS().isEmpty(), "a reference state carries no flow");
    }
}
