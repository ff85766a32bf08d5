package org.steamtally.calc.reconcile;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.CoolingWater;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.FuelMeasurement;
import org.steamtally.calc.plant.MotorMeasurement;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UncertainConstant;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.steam.Steam;

/**
 * The unit of deploy/examples/regenerative.yaml (fictional site fernholm, unit3), transcribed by
 * hand into calc's records with the loader's conversions (expanded uncertainties at k = 2 halved,
 * °C + 273.15, t/h / 3.6, bar and kPa to Pa, 2.5 barg on 1008 mbar), and one operating point that
 * closes every balance exactly, built here from the states' nominal p and T with the IF97 facade
 * and the mass and energy balances solved by hand (see {@link #consistentValues}), not by the
 * reconciler.
 */
final class RegenerativeExample {

    static final Instant TS = Instant.parse("2026-12-01T06:30:00Z");
    static final double COOLING_WATER_PRESSURE_PA = 2.5e5 + 1008e2;
    static final double HEATING_VALUE = 25.1e6;
    static final double BOILER_EFFICIENCY = 0.89;
    static final double GENERATOR_EFFICIENCY = 0.985;
    static final double CONDENSATE_MOTOR_EFFICIENCY = 0.92;
    static final double FEED_MOTOR_EFFICIENCY = 0.96;

    private final List<Sensor> sensors = new ArrayList<>();

    private RegenerativeExample() {
    }

    static UnitDescription unit() {
        return new RegenerativeExample().build();
    }

    private void sensor(String id, Quantity q, double sigma, double min, double max) {
        sensors.add(new Sensor(id, q, q.siUnit(), sigma, UncertaintyBasis.expanded(2.0), min, max, Duration.ofSeconds(5),
                Optional.of("fernholm/unit3/" + id)));
    }

    private static double celsius(double c) {
        return c + 273.15;
    }

    private UnitDescription build() {
        sensor("PT-101", Quantity.PRESSURE, 0.02e6 / 2, 0, 20e6);
        sensor("TT-101", Quantity.TEMPERATURE, 1.5 / 2, celsius(0), celsius(600));
        sensor("FT-101", Quantity.MASS_FLOW, 1.25 / 2, 0, 180);
        sensor("PT-111", Quantity.PRESSURE, 0.015e6 / 2, 0, 10e6);
        sensor("TT-111", Quantity.TEMPERATURE, 1.5 / 2, celsius(0), celsius(550));
        sensor("PT-121", Quantity.PRESSURE, 0.01e6 / 2, 0, 6e6);
        sensor("TT-121", Quantity.TEMPERATURE, 1.5 / 2, celsius(0), celsius(500));
        sensor("PT-131", Quantity.PRESSURE, 0.01e6 / 2, 0, 6e6);
        sensor("TT-131", Quantity.TEMPERATURE, 1.5 / 2, celsius(0), celsius(600));
        sensor("PT-141", Quantity.PRESSURE, 5e3 / 2, 0, 2500e3);
        sensor("TT-141", Quantity.TEMPERATURE, 1.5 / 2, celsius(0), celsius(500));
        sensor("PT-151", Quantity.PRESSURE, 1.2e3 / 2, 0, 600e3);
        sensor("TT-151", Quantity.TEMPERATURE, 1.5 / 2, celsius(0), celsius(400));
        sensor("PT-301", Quantity.PRESSURE, 0.05e3 / 2, 0, 25e3);
        sensor("PT-302", Quantity.PRESSURE, 0.05e3 / 2, 0, 25e3);
        sensor("PT-311", Quantity.PRESSURE, 0.008e6 / 2, 0, 4e6);
        sensor("TT-311", Quantity.TEMPERATURE, 0.5 / 2, celsius(0), celsius(100));
        sensor("PT-321", Quantity.PRESSURE, 0.008e6 / 2, 0, 4e6);
        sensor("TT-321", Quantity.TEMPERATURE, 0.5 / 2, celsius(0), celsius(200));
        sensor("PT-331", Quantity.PRESSURE, 1.2e3 / 2, 0, 600e3);
        sensor("PT-341", Quantity.PRESSURE, 0.008e6 / 2, 0, 4e6);
        sensor("TT-341", Quantity.TEMPERATURE, 0.5 / 2, celsius(0), celsius(200));
        sensor("PT-401", Quantity.PRESSURE, 0.05e5 / 2, 0, 25e5);
        sensor("PT-411", Quantity.PRESSURE, 0.05e6 / 2, 0, 25e6);
        sensor("TT-411", Quantity.TEMPERATURE, 0.5 / 2, celsius(0), celsius(300));
        sensor("PT-421", Quantity.PRESSURE, 0.05e6 / 2, 0, 25e6);
        sensor("TT-421", Quantity.TEMPERATURE, 0.5 / 2, celsius(0), celsius(300));
        sensor("FT-421", Quantity.MASS_FLOW, 4.5 / 3.6 / 2, 0, 650 / 3.6);
        sensor("PT-431", Quantity.PRESSURE, 0.015e6 / 2, 0, 10e6);
        sensor("FT-501", Quantity.MASS_FLOW, 100.0 / 2, 0, 7000);
        sensor("TT-501", Quantity.TEMPERATURE, 0.2 / 2, celsius(-5), celsius(45));
        sensor("TT-502", Quantity.TEMPERATURE, 0.2 / 2, celsius(-5), celsius(50));
        sensor("FT-900", Quantity.MASS_FLOW, 1.2 / 3.6 / 2, 0, 100 / 3.6);
        sensor("JT-001", Quantity.POWER, 0.3e6 / 2, 0, 180e6);
        sensor("JT-601", Quantity.POWER, 13e3 / 2, 0, 4000e3);
        sensor("JT-602", Quantity.POWER, 1.25e3 / 2, 0, 400e3);

        List<StateDefinition> states = List.of(
                pt("main_steam", "PT-101", "TT-101", "FT-101"),
                pt("hp_extraction", "PT-111", "TT-111", null),
                pt("cold_reheat", "PT-121", "TT-121", null),
                new StateDefinition("cold_reheat_ideal", new StateFix.Isentropic("main_steam", "cold_reheat"), Optional.empty()),
                pt("hot_reheat", "PT-131", "TT-131", null),
                pt("da_extraction", "PT-141", "TT-141", null),
                pt("lp_extraction", "PT-151", "TT-151", null),
                new StateDefinition("lp_exhaust", new StateFix.EnergyBalance("PT-301", "condenser"), Optional.empty()),
                new StateDefinition("lp_exhaust_ideal", new StateFix.Isentropic("hot_reheat", "lp_exhaust"), Optional.empty()),
                new StateDefinition("condensate", new StateFix.SaturatedLiquid("PT-302"), Optional.empty()),
                pt("condensate_pumped", "PT-311", "TT-311", null),
                new StateDefinition("condensate_pumped_ideal", new StateFix.Isentropic("condensate", "condensate_pumped"),
                        Optional.empty()),
                pt("lp_heater_outlet", "PT-321", "TT-321", null),
                new StateDefinition("lp_drain", new StateFix.SaturatedLiquid("PT-331"), Optional.empty()),
                pt("lp_drain_pumped", "PT-341", "TT-341", null),
                new StateDefinition("deaerator_outlet", new StateFix.SaturatedLiquid("PT-401"), Optional.empty()),
                pt("feed_pump_discharge", "PT-411", "TT-411", null),
                new StateDefinition("feed_pump_discharge_ideal",
                        new StateFix.Isentropic("deaerator_outlet", "feed_pump_discharge"), Optional.empty()),
                new StateDefinition("feedwater", new StateFix.MeasuredPressureTemperature("PT-421", "TT-421"),
                        Optional.empty(), Optional.of("FT-421")),
                new StateDefinition("hp_drain", new StateFix.SaturatedLiquid("PT-431"), Optional.empty()));

        List<Component> components = List.of(
                new Component.SteamGenerator("boiler", "feedwater", "main_steam",
                        Optional.of(new FuelMeasurement("FT-900", new UncertainConstant(HEATING_VALUE, 0.25e6),
                                new UncertainConstant(BOILER_EFFICIENCY, 0.01)))),
                new Component.TurbineSection("hp_turbine", "main_steam", "cold_reheat", List.of("hp_extraction"),
                        Optional.of("cold_reheat_ideal")),
                new Component.Reheater("reheater", "cold_reheat", "hot_reheat"),
                new Component.TurbineSection("lp_turbine", "hot_reheat", "lp_exhaust",
                        List.of("da_extraction", "lp_extraction"), Optional.of("lp_exhaust_ideal")),
                new Component.Condenser("condenser", List.of("lp_exhaust"), "condensate",
                        Optional.of(new CoolingWater("FT-501", "TT-501", "TT-502", COOLING_WATER_PRESSURE_PA))),
                new Component.Pump("condensate_pump", "condensate", "condensate_pumped",
                        Optional.of(new MotorMeasurement("JT-602", new UncertainConstant(CONDENSATE_MOTOR_EFFICIENCY, 0.015))),
                        Optional.of("condensate_pumped_ideal")),
                new Component.ClosedFeedwaterHeater("lp_heater", "condensate_pumped", "lp_heater_outlet", "lp_extraction",
                        List.of(), "lp_drain"),
                new Component.Pump("drain_pump", "lp_drain", "lp_drain_pumped", Optional.empty(), Optional.empty()),
                new Component.OpenFeedwaterHeater("deaerator",
                        List.of("lp_heater_outlet", "lp_drain_pumped", "da_extraction", "hp_drain"), "deaerator_outlet"),
                new Component.Pump("feed_pump", "deaerator_outlet", "feed_pump_discharge",
                        Optional.of(new MotorMeasurement("JT-601", new UncertainConstant(FEED_MOTOR_EFFICIENCY, 0.01))),
                        Optional.of("feed_pump_discharge_ideal")),
                new Component.ClosedFeedwaterHeater("hp_heater", "feed_pump_discharge", "feedwater", "hp_extraction",
                        List.of(), "hp_drain"),
                new Component.Generator("generator", List.of("hp_turbine", "lp_turbine"), "JT-001",
                        new UncertainConstant(GENERATOR_EFFICIENCY, 0.002)));
        return new UnitDescription("unit3", "Fernholm unit 3", sensors, states, components, DeadState.STANDARD);
    }

    private static StateDefinition pt(String id, String p, String t, String flow) {
        return new StateDefinition(id, new StateFix.MeasuredPressureTemperature(p, t), Optional.ofNullable(flow));
    }

    /**
     * Sensor values, in the unit's order, at which every mass and energy balance closes exactly:
     * p and T at the example's nominal figures, the exhaust at quality 0.93, 125 kg/s main steam,
     * 5000 kg/s cooling water at 18 °C. The flows follow by hand from the balances: boiler and HP
     * heater tubes carry M; the HP heater shell gives m_hx = M (h_fw − h_fpd) / (h_hx − h_hd); the
     * LP heater gives m_l = a m_c with a = (h_lho − h_cp) / (h_lx − h_ld); the LP turbine and the
     * deaerator's mass balance give m_d = M − m_hx − (1 + a) m_c, and its energy balance
     * m_c [h_lho + a h_ldp − (1 + a) h_dx] = M h_dao − (M − m_hx) h_dx − m_hx h_hd. The independent
     * measurements then follow from their definitions: P_el = η_gen W_turbines, the cooling-water
     * outlet from h(p_cw, T_out) = h(p_cw, T_in) + Q_cond / m_cw by IF97's backward T(p, h), motor
     * powers W / η_motor, fuel flow Q_boiler+reheater / (η_boiler HV).
     */
    static Map<String, Double> consistentValues() {
        Map<String, Double> v = new LinkedHashMap<>();
        double pMs = 12.5e6, tMs = celsius(540);
        double pHx = 4.2e6, tHx = celsius(395);
        double pCr = 2.8e6, tCr = celsius(345);
        double pHr = 2.6e6, tHr = celsius(540);
        double pDx = 0.9e6, tDx = celsius(400);
        double pLx = 250e3, tLx = celsius(250);
        double pEx = 8e3, pC = 8e3;
        double pCp = 1.6e6, tCp = celsius(42);
        double pLho = 1.5e6, tLho = celsius(122);
        double pLd = 240e3;
        double pLdp = 1.6e6, tLdp = celsius(127);
        double pDa = 0.85e6;
        double pFpd = 15e6, tFpd = celsius(177);
        double pFw = 14.6e6, tFw = celsius(245);
        double pHd = 4.0e6;
        double m = 125.0;
        double mCw = 5000.0, tCwIn = celsius(18);

        double hMs = Steam.enthalpyPT(pMs, tMs);
        double hHx = Steam.enthalpyPT(pHx, tHx);
        double hCr = Steam.enthalpyPT(pCr, tCr);
        double hHr = Steam.enthalpyPT(pHr, tHr);
        double hDx = Steam.enthalpyPT(pDx, tDx);
        double hLx = Steam.enthalpyPT(pLx, tLx);
        double hEx = Steam.statePX(pEx, 0.93).enthalpyJPerKg();
        double hC = Steam.statePX(pC, 0.0).enthalpyJPerKg();
        double hCp = Steam.enthalpyPT(pCp, tCp);
        double hLho = Steam.enthalpyPT(pLho, tLho);
        double hLd = Steam.statePX(pLd, 0.0).enthalpyJPerKg();
        double hLdp = Steam.enthalpyPT(pLdp, tLdp);
        double hDa = Steam.statePX(pDa, 0.0).enthalpyJPerKg();
        double hFpd = Steam.enthalpyPT(pFpd, tFpd);
        double hFw = Steam.enthalpyPT(pFw, tFw);
        double hHd = Steam.statePX(pHd, 0.0).enthalpyJPerKg();

        double mHx = m * (hFw - hFpd) / (hHx - hHd);
        double a = (hLho - hCp) / (hLx - hLd);
        double mC = (m * hDa - (m - mHx) * hDx - mHx * hHd) / (hLho + a * hLdp - (1 + a) * hDx);
        double mL = a * mC;
        double mD = m - mHx - (1 + a) * mC;
        double mCr = m - mHx;
        if (!(mC > 0 && mL > 0 && mD > 0)) {
            throw new IllegalStateException("operating point gives a negative flow");
        }
        double work = m * hMs - mHx * hHx - mCr * hCr + mCr * hHr - mD * hDx - mL * hLx - mC * hEx;
        double qCond = mC * (hEx - hC);
        double hCwIn = Steam.enthalpyPT(COOLING_WATER_PRESSURE_PA, tCwIn);
        double tCwOut = Steam.temperaturePH(COOLING_WATER_PRESSURE_PA, hCwIn + qCond / mCw);
        double qBoiler = m * (hMs - hFw) + mCr * (hHr - hCr);

        v.put("PT-101", pMs);
        v.put("TT-101", tMs);
        v.put("FT-101", m);
        v.put("PT-111", pHx);
        v.put("TT-111", tHx);
        v.put("PT-121", pCr);
        v.put("TT-121", tCr);
        v.put("PT-131", pHr);
        v.put("TT-131", tHr);
        v.put("PT-141", pDx);
        v.put("TT-141", tDx);
        v.put("PT-151", pLx);
        v.put("TT-151", tLx);
        v.put("PT-301", pEx);
        v.put("PT-302", pC);
        v.put("PT-311", pCp);
        v.put("TT-311", tCp);
        v.put("PT-321", pLho);
        v.put("TT-321", tLho);
        v.put("PT-331", pLd);
        v.put("PT-341", pLdp);
        v.put("TT-341", tLdp);
        v.put("PT-401", pDa);
        v.put("PT-411", pFpd);
        v.put("TT-411", tFpd);
        v.put("PT-421", pFw);
        v.put("TT-421", tFw);
        v.put("FT-421", m);
        v.put("PT-431", pHd);
        v.put("FT-501", mCw);
        v.put("TT-501", tCwIn);
        v.put("TT-502", tCwOut);
        v.put("FT-900", qBoiler / (BOILER_EFFICIENCY * HEATING_VALUE));
        v.put("JT-001", GENERATOR_EFFICIENCY * work);
        v.put("JT-601", m * (hFpd - hDa) / FEED_MOTOR_EFFICIENCY);
        v.put("JT-602", mC * (hCp - hC) / CONDENSATE_MOTOR_EFFICIENCY);
        return v;
    }

    /** The consistent values in the unit's sensor order. */
    static double[] consistentArray(UnitDescription unit) {
        Map<String, Double> v = consistentValues();
        double[] out = new double[unit.sensors().size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = v.get(unit.sensors().get(i).id());
        }
        return out;
    }

    static int index(UnitDescription unit, String sensorId) {
        for (int i = 0; i < unit.sensors().size(); i++) {
            if (unit.sensors().get(i).id().equals(sensorId)) {
                return i;
            }
        }
        throw new IllegalArgumentException(sensorId);
    }

    static Snapshot snapshot(UnitDescription unit, double[] values) {
        return Snapshot.allGood(TS, unit.id(), values);
    }
}
