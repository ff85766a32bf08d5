package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.PlantValidator;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UnitDescription;

class ExamplePlantDescriptionTest {

    /** The shipped examples, found from the module directory that Maven runs the tests in. */
    static Path example(String name) {
        Path inModule = Path.of("examples", name);
        return Files.exists(inModule) ? inModule : Path.of("deploy", "examples", name);
    }

    @ParameterizedTest
    @ValueSource(strings = {"simple.yaml", "reheat.yaml", "regenerative.yaml"})
    void shippedExampleLoadsAndValidates(String name) throws Exception {
        PlantDescription plant = PlantDescriptionLoader.load(example(name));
        assertEquals("fernholm", plant.siteId());
        assertEquals(List.of(), PlantValidator.validate(plant));
    }

    @ParameterizedTest
    @ValueSource(strings = {"simple.yaml", "reheat.yaml", "regenerative.yaml"})
    void shippedExampleCompilesIntoACycleModel(String name) throws Exception {
        PlantDescription plant = PlantDescriptionLoader.load(example(name));
        for (UnitDescription unit : plant.units()) {
            assertEquals(unit.id(), CycleModel.compile(plant.siteId(), unit).unitId());
        }
    }

    @Test
    void mixerOutletFixedByItsMixingLoadsAndCompiles() throws Exception {
        Path file = Path.of(getClass().getResource("valid-mixing-outlet.yaml").toURI());
        PlantDescription plant = PlantDescriptionLoader.load(file);
        assertEquals("u1", CycleModel.compile(plant.siteId(), plant.units().get(0)).unitId());
    }

    @Test
    void minimalFileLoadsWithDefaults() throws Exception {
        Path file = Path.of(getClass().getResource("valid-minimal.yaml").toURI());
        UnitDescription unit = PlantDescriptionLoader.load(file).units().get(0);
        assertEquals(DeadState.STANDARD, unit.deadState());
        assertEquals("u1", unit.name());
        Sensor pt = unit.sensor("PT-1").orElseThrow();
        assertEquals(PlantDescriptionLoader.DEFAULT_MAX_AGE, pt.maxAge());
        assertTrue(pt.topic().isEmpty());
        // A bare number is a standard uncertainty: 0.01 MPa.
        assertEquals(1e4, pt.standardUncertaintySi(), 1e-9);
        assertEquals(1.0, pt.uncertaintyBasis().coverageFactor());
    }

    @Test
    void simpleExampleConvertsEngineeringUnitsToSi() throws Exception {
        PlantDescription plant = PlantDescriptionLoader.load(example("simple.yaml"));
        assertEquals(100.8e3, plant.atmosphericPressurePa(), 1e-9);
        UnitDescription unit = plant.unit("unit1").orElseThrow();
        assertEquals(new DeadState(288.15, 100.8e3), unit.deadState());
        Sensor flow = unit.sensor("FT-101").orElseThrow();
        assertEquals(Quantity.MASS_FLOW, flow.quantity());
        assertEquals("t/h", flow.engineeringUnit());
        // 1.6 t/h expanded at k = 2: u = 0.8 t/h = 0.8 · 1000 / 3600 kg/s.
        assertEquals(0.8 * 1000.0 / 3600.0, flow.standardUncertaintySi(), 1e-12);
        assertEquals(200.0 * 1000.0 / 3600.0, flow.rangeMaxSi(), 1e-9);
        assertEquals(Duration.ofSeconds(5), flow.maxAge());
        assertEquals("fernholm/unit1/FT-101", flow.topic().orElseThrow());
        Sensor tt = unit.sensor("TT-101").orElseThrow();
        assertEquals(873.15, tt.rangeMaxSi(), 1e-9);
        assertEquals(0.75, tt.standardUncertaintySi(), 1e-12);
        Component.SteamGenerator boiler = assertInstanceOf(Component.SteamGenerator.class,
                unit.component("boiler").orElseThrow());
        assertEquals(25.1e6, boiler.fuel().orElseThrow().heatingValueJPerKg().value(), 1e-6);
        assertEquals(0.25e6, boiler.fuel().orElseThrow().heatingValueJPerKg().standardUncertainty(), 1e-6);
        Component.Condenser condenser = assertInstanceOf(Component.Condenser.class,
                unit.component("condenser").orElseThrow());
        // 1.5 barg over the site's 100.8 kPa.
        assertEquals(1.5e5 + 100.8e3, condenser.coolingWater().orElseThrow().pressurePa(), 1e-6);
        assertInstanceOf(StateFix.EnergyBalance.class, unit.state("exhaust").orElseThrow().fix());
    }

    @Test
    void reheatExampleConvertsUsCustomaryUnitsWithTheSiteAtmosphere() throws Exception {
        PlantDescription plant = PlantDescriptionLoader.load(example("reheat.yaml"));
        // 29.77 inHg, conventional inch of mercury 3386.389 Pa (NIST SP 811 (2008), B.8).
        double atmosphere = 29.77 * 3386.38864;
        assertEquals(atmosphere, plant.atmosphericPressurePa(), 1e-3);
        UnitDescription unit = plant.units().get(0);
        assertEquals(DeadState.STANDARD, unit.deadState());
        Sensor pt = unit.sensor("PT-201").orElseThrow();
        // Range 0 to 2500 psig, absolute in SI; the uncertainty 5 psi (k = 2) has no offset.
        double psi = 6894.757293168361;
        assertEquals(atmosphere, pt.rangeMinSi(), 1e-3);
        assertEquals(2500 * psi + atmosphere, pt.rangeMaxSi(), 1e-3);
        assertEquals(2.5 * psi, pt.standardUncertaintySi(), 1e-9);
        Sensor tt = unit.sensor("TT-201").orElseThrow();
        assertEquals(273.15, tt.rangeMinSi(), 1e-9);
        // 2.7 °F at k = 2: 1.35 °F = 0.75 K.
        assertEquals(0.75, tt.standardUncertaintySi(), 1e-12);
        Component.SteamGenerator boiler = assertInstanceOf(Component.SteamGenerator.class,
                unit.component("boiler").orElseThrow());
        // 11 800 Btu/lb at 2326 J/kg per Btu/lb (NIST SP 811 (2008), B.8, exact).
        assertEquals(11800 * 2326.0, boiler.fuel().orElseThrow().heatingValueJPerKg().value(), 1e-6);
        assertEquals(120 * 2326.0, boiler.fuel().orElseThrow().heatingValueJPerKg().standardUncertainty(), 1e-6);
    }

    @Test
    void regenerativeExampleHasTheHeaterTrainItDescribes() throws Exception {
        UnitDescription unit = PlantDescriptionLoader.load(example("regenerative.yaml")).units().get(0);
        long closed = unit.components().stream().filter(c -> c instanceof Component.ClosedFeedwaterHeater).count();
        long open = unit.components().stream().filter(c -> c instanceof Component.OpenFeedwaterHeater).count();
        assertEquals(2, closed);
        assertEquals(1, open);
        assertTrue(unit.sensors().size() >= 30, "about 30 sensors");
        long metered = unit.states().stream().filter(s -> s.flowSensor().isPresent()).count();
        assertEquals(1, metered, "main steam flow only; the extraction flows follow from balances");
        for (var state : unit.states()) {
            boolean wet = state.fix() instanceof StateFix.EnergyBalance;
            assertEquals(state.id().equals("lp_exhaust"), wet, state.id());
        }
    }
}
