package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Which balances a sensor takes part in, for the regenerative example. The expected lists are
 * derived by hand in each test from the fixture's states and components: a flow meter enters the
 * mass balances of the components its stream joins and the energy balances through it; a p/T pair
 * enters the energy balances of the components its state joins; an independent measurement enters
 * its own balance. Order: per component its mass and adiabatic balances, then check-flow meters,
 * then the balances against an independent measurement, each in component order.
 */
class BalanceParticipationTest {

    private static final UnitDescription UNIT = RegenerativeExample.unit();
    private static final Reconciler RECONCILER = Reconciler.compile(UNIT);

    @Test
    void theMainSteamFlowMeterTakesPartInTheBalancesOfBoilerAndTurbines() {
        // main_steam: outlet of the boiler, inlet of hp_turbine; its flow and enthalpy enter the
        // boiler's fuel balance (boiler with the reheater, the only steam generator) and the
        // turbines-against-generator balance.
        assertEquals(List.of("mass balance of boiler", "mass balance of hp_turbine", "energy balance of boiler+fuel",
                "energy balance of hp_turbine+lp_turbine+generator"), RECONCILER.balancesOf("FT-101"));
    }

    @Test
    void theCheckFlowMeterOnTheFeedwaterEntersOnlyItsOwnCheck() {
        // feedwater has no flow sensor of its own; FT-421 is its check meter, m_feedwater − m_FT-421 = 0
        assertEquals(List.of("check flow FT-421 on feedwater"), RECONCILER.balancesOf("FT-421"));
    }

    @Test
    void independentMeasurementsEnterTheBalanceTheyClose() {
        assertAll(
                // TT-502: cooling-water outlet temperature of the condenser
                () -> assertEquals(List.of("energy balance of condenser+cooling_water"), RECONCILER.balancesOf("TT-502")),
                // JT-001: its duplicate JT-001B, and generator output against hp_turbine and lp_turbine on its shaft
                () -> assertEquals(List.of("same measurand JT-001 = JT-001B", "energy balance of hp_turbine+lp_turbine+generator"),
                        RECONCILER.balancesOf("JT-001")),
                // the duplicate enters only the balance with its primary
                () -> assertEquals(List.of("same measurand JT-001 = JT-001B"), RECONCILER.balancesOf("JT-001B")),
                // the declared generator efficiency with its uncertainty is a quasi-measurement of the same balance
                () -> assertEquals(List.of("energy balance of hp_turbine+lp_turbine+generator"),
                        RECONCILER.balancesOf("generator.efficiency")));
    }

    @Test
    void aTemperatureEntersTheEnergyBalancesOfTheComponentsItsStateJoins() {
        assertAll(
                // TT-411 fixes feed_pump_discharge: outlet of feed_pump (motor metered), tube inlet of hp_heater
                () -> assertEquals(List.of("energy balance of hp_heater", "energy balance of feed_pump+motor"),
                        RECONCILER.balancesOf("TT-411")),
                // PT-302 fixes condensate (saturated liquid): outlet of the condenser, inlet of condensate_pump;
                // and has a duplicate
                () -> assertEquals(List.of("same measurand PT-302 = PT-302B", "energy balance of condenser+cooling_water",
                        "energy balance of condensate_pump+motor"), RECONCILER.balancesOf("PT-302")));
    }

    @Test
    void theExhaustPressureOfAStateFixedByAnEnergyBalanceIsInNoBalanceAndIsJustDetermined() {
        // lp_exhaust's enthalpy is an unknown solved from the condenser's balance; PT-301 fixes no enthalpy
        ReconciliationResult r = RECONCILER.reconcile(RegenerativeExample.snapshot(UNIT,
                RegenerativeExample.consistentArray(UNIT))).result();
        ReconciledSensor pt301 = r.sensors().stream().filter(s -> s.id().equals("PT-301")).findFirst().orElseThrow();
        assertAll(
                () -> assertEquals(List.of(), RECONCILER.balancesOf("PT-301")),
                () -> assertEquals("just_determined", pt301.redundancy()));
    }

    @Test
    void anIdThatIsNoQuantityOfTheUnitHasNoBalances() {
        assertEquals(List.of(), RECONCILER.balancesOf("XT-999"));
    }

    @Test
    void everyQuantityFoundRedundantTakesPartInSomeBalance() {
        // A quantity in no balance has no column in ∂f/∂x and cannot be redundant.
        ReconciliationResult r = RECONCILER.reconcile(RegenerativeExample.snapshot(UNIT,
                RegenerativeExample.consistentArray(UNIT))).result();
        assertAll(r.sensors().stream().filter(s -> s.redundancy().equals("redundant"))
                .map(s -> () -> assertFalse(RECONCILER.balancesOf(s.id()).isEmpty(), s.id())));
    }

    @Test
    void theEvaluatorOffersTheSameAnswer() {
        assertEquals(RECONCILER.balancesOf("FT-101"),
                ReconcilingEvaluator.compile("fernholm", UNIT).balancesOf("FT-101"));
    }
}
