package org.steamtally.deploy.replay;

import static org.steamtally.deploy.replay.IndependentIf97.h;
import static org.steamtally.deploy.replay.IndependentIf97.hLiquid;
import static org.steamtally.deploy.replay.IndependentIf97.hPS;
import static org.steamtally.deploy.replay.IndependentIf97.s;
import static org.steamtally.deploy.replay.IndependentIf97.sLiquid;
import static org.steamtally.deploy.replay.IndependentIf97.temperaturePH;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Hand-built heat balances of the fictional Fernholm units in {@code deploy/examples}, one steady
 * operating point each, our own numbers (chosen section and pump efficiencies, pressures and
 * temperatures typical of such units: common practice, not any plant's data). Every enthalpy comes
 * from the independent {@code com.hummeling:if97}; the flows from the heater balances solved in
 * closed form here; the independent measurements (generator output, motor power, fuel flow,
 * cooling-water flow) are set to what the balances say they read, so every closure of a consistent
 * reading is zero.
 */
final class FernholmOperatingPoints {

    /** NIST SP 811 (2008), B.8: pound (avoirdupois) = 0.453 592 37 kg, exact. */
    private static final double POUND_KG = 0.45359237;
    /** NIST SP 811 (2008), B.8: standard acceleration of gravity, exact. */
    private static final double STANDARD_GRAVITY = 9.80665;
    /** NIST SP 811 (2008), B.8: inch = 0.0254 m, exact. */
    private static final double INCH_M = 0.0254;
    /** psi = lb · g_n / in², NIST SP 811 (2008), B.8: 6.894 757 E+03 Pa. */
    private static final double PSI_PA = POUND_KG * STANDARD_GRAVITY / (INCH_M * INCH_M);
    /** Conventional inch of mercury, NIST SP 811 (2008), B.8: 3.386 389 E+03 Pa. */
    private static final double INCH_HG_PA = 13595.1 * STANDARD_GRAVITY * INCH_M;
    /** 0 °C in K and °F (ITS-90 / NIST SP 811 (2008), 4.2.1.1). */
    private static final double ZERO_CELSIUS_K = 273.15;

    private FernholmOperatingPoints() {
    }

    private static double celsius(double k) {
        return k - ZERO_CELSIUS_K;
    }

    private static double fahrenheit(double k) {
        return k * 1.8 - 459.67;
    }

    private static double kelvinFromFahrenheit(double f) {
        return (f + 459.67) / 1.8;
    }

    private static double poundsPerHour(double kgPerS) {
        return kgPerS * 3600.0 / POUND_KG;
    }

    /** Expansion along one line of section efficiency {@code eta} from (hIn, sIn) to p. */
    private static double expand(double hIn, double sIn, double pPa, double eta, double tGuessK) {
        return hIn - eta * (hIn - hPS(pPa, sIn, tGuessK));
    }

    /** Compression of liquid at (pIn, saturated or tIn) to pOut with pump efficiency {@code eta}. */
    private static double pump(double hIn, double sIn, double pOut, double eta, double tGuessK) {
        return hIn + (hPS(pOut, sIn, tGuessK) - hIn) / eta;
    }

    /**
     * Unit 1 of {@code simple.yaml}: 9 MPa / 510 °C, 35 kg/s, condenser at 7 kPa, feed pump to
     * 10.5 MPa; turbine efficiency 0.86, pump 0.78.
     */
    static ExampleOperatingPoint simple() {
        double atmosphere = 100.8e3;                       // as in the file
        double coolingWaterPa = 1.5e5 + atmosphere;        // 1.5 barg
        double generatorEfficiency = 0.975;                // as declared in the file
        double motorEfficiency = 0.95;
        double boilerEfficiency = 0.89;
        double heatingValue = 25.1e6;

        double m = 35.0;
        double pMain = 9.0e6;
        double tMain = 783.15;
        double pCondenser = 7e3;
        double pFeed = 10.5e6;
        double tCoolingIn = 291.15;
        double tCoolingOut = 300.15;

        double hMain = h(pMain, tMain);
        double hExhaust = expand(hMain, s(pMain, tMain), pCondenser, 0.86, 320);
        double hCondensate = hLiquid(pCondenser);
        double hFeed = pump(hCondensate, sLiquid(pCondenser), pFeed, 0.78, 315);

        double turbineWork = m * (hMain - hExhaust);
        double pumpWork = m * (hFeed - hCondensate);
        double heatAdded = m * (hMain - hFeed);
        double rejected = m * (hExhaust - hCondensate);
        double coolingWaterFlow = rejected / (h(coolingWaterPa, tCoolingOut) - h(coolingWaterPa, tCoolingIn));

        Map<String, Double> r = new LinkedHashMap<>();
        Map<String, String> u = new LinkedHashMap<>();
        put(r, u, "PT-101", pMain / 1e6, "MPa");
        put(r, u, "TT-101", celsius(tMain), "Cel");
        put(r, u, "FT-101", m * 3.6, "t/h");
        put(r, u, "PT-301", pCondenser / 1e3, "kPa");
        put(r, u, "PT-302", pCondenser / 1e3, "kPa");
        put(r, u, "PT-401", pFeed / 1e5, "bar");
        put(r, u, "TT-401", celsius(temperaturePH(pFeed, hFeed, 315)), "Cel");
        put(r, u, "FT-501", coolingWaterFlow, "kg/s");
        put(r, u, "TT-501", celsius(tCoolingIn), "Cel");
        put(r, u, "TT-502", celsius(tCoolingOut), "Cel");
        put(r, u, "FT-900", heatAdded / (heatingValue * boilerEfficiency), "kg/s");
        put(r, u, "JT-001", turbineWork * generatorEfficiency / 1e6, "MW");
        put(r, u, "JT-401", pumpWork / motorEfficiency / 1e3, "kW");
        return new ExampleOperatingPoint("simple.yaml", "fernholm/unit1/", r, u,
                List.of("cycle", "turbine+generator", "boiler+fuel", "feed_pump+motor"),
                new ExampleOperatingPoint.Figures(heatAdded, rejected, turbineWork, pumpWork));
    }

    /**
     * Unit 3 of {@code regenerative.yaml}: 12.5 MPa / 540 °C, 125 kg/s, reheat to 540 °C at 2.6 MPa,
     * an HP heater draining backward to the deaerator, an LP heater whose drain is pumped forward
     * into the deaerator, condenser at 8 kPa. HP section efficiency 0.86, LP section 0.88 (on one
     * expansion line for extractions and exhaust), pumps 0.80 (feed), 0.75 (condensate), 0.70
     * (drain).
     */
    static ExampleOperatingPoint regenerative() {
        double atmosphere = 100.8e3;                       // 1008 mbar, as in the file
        double coolingWaterPa = 2.5e5 + atmosphere;        // 2.5 barg
        double generatorEfficiency = 0.985;                // as declared in the file
        double feedMotorEfficiency = 0.96;
        double condensateMotorEfficiency = 0.92;
        double boilerEfficiency = 0.89;
        double heatingValue = 25.1e6;

        double m = 125.0;
        double pMain = 12.5e6;
        double tMain = 813.15;
        double pHpx = 4.2e6;
        double pCold = 2.8e6;
        double pHot = 2.6e6;
        double tHot = 813.15;
        double pDa = 0.9e6;
        double pLpx = 0.25e6;
        double pCondenser = 8e3;
        double pCondensatePumped = 1.6e6;
        double pLpOut = 1.5e6;
        double tLpOut = 395.15;
        double pLpDrain = 240e3;
        double pDrainPumped = 1.6e6;
        double pDeaerator = 0.85e6;
        double pFeedPumped = 15e6;
        double pFeed = 14.6e6;
        double tFeed = 518.15;
        double pHpDrain = 4.0e6;
        double tCoolingIn = 291.15;
        double tCoolingOut = 300.15;

        double hMain = h(pMain, tMain);
        double sMain = s(pMain, tMain);
        double hHpx = expand(hMain, sMain, pHpx, 0.86, 650);
        double hCold = expand(hMain, sMain, pCold, 0.86, 620);
        double hHot = h(pHot, tHot);
        double sHot = s(pHot, tHot);
        double hDa = expand(hHot, sHot, pDa, 0.88, 640);
        double hLpx = expand(hHot, sHot, pLpx, 0.88, 500);
        double hExhaust = expand(hHot, sHot, pCondenser, 0.88, 320);
        double hCondensate = hLiquid(pCondenser);
        double hCondensatePumped = pump(hCondensate, sLiquid(pCondenser), pCondensatePumped, 0.75, 315);
        double hLpOut = h(pLpOut, tLpOut);
        double hLpDrain = hLiquid(pLpDrain);
        double hDrainPumped = pump(hLpDrain, sLiquid(pLpDrain), pDrainPumped, 0.70, 400);
        double hDeaerator = hLiquid(pDeaerator);
        double hFeedPumped = pump(hDeaerator, sLiquid(pDeaerator), pFeedPumped, 0.80, 450);
        double hFeed = h(pFeed, tFeed);
        double hHpDrain = hLiquid(pHpDrain);

        // HP heater: m_hp (h_hpx − h_hp,drain) = m (h_feed − h_feed,pumped).
        double mHp = m * (hFeed - hFeedPumped) / (hHpx - hHpDrain);
        double mCold = m - mHp;
        // LP heater: m_lp = k m_c with k = (h_lp,out − h_c,pumped) / (h_lpx − h_lp,drain).
        double k = (hLpOut - hCondensatePumped) / (hLpx - hLpDrain);
        // Deaerator, mass: m_c (1 + k) + m_da = m − m_hp = A;
        // energy: m_c (h_lp,out + k h_drain,pumped) + m_da h_da = m h_deaerator − m_hp h_hp,drain = B.
        double a = m - mHp;
        double b = m * hDeaerator - mHp * hHpDrain;
        double mC = (b - a * hDa) / (hLpOut + k * hDrainPumped - (1 + k) * hDa);
        double mLp = k * mC;
        double mDa = a - (1 + k) * mC;

        double hpWork = m * hMain - mHp * hHpx - mCold * hCold;
        double lpWork = mCold * hHot - mDa * hDa - mLp * hLpx - mC * hExhaust;
        double condensatePumpWork = mC * (hCondensatePumped - hCondensate);
        double drainPumpWork = mLp * (hDrainPumped - hLpDrain);
        double feedPumpWork = m * (hFeedPumped - hDeaerator);
        double boilerHeat = m * (hMain - hFeed);
        double reheatHeat = mCold * (hHot - hCold);
        double rejected = mC * (hExhaust - hCondensate);
        double coolingWaterFlow = rejected / (h(coolingWaterPa, tCoolingOut) - h(coolingWaterPa, tCoolingIn));

        Map<String, Double> r = new LinkedHashMap<>();
        Map<String, String> u = new LinkedHashMap<>();
        put(r, u, "PT-101", pMain / 1e6, "MPa");
        put(r, u, "TT-101", celsius(tMain), "Cel");
        put(r, u, "FT-101", m, "kg/s");
        put(r, u, "PT-111", pHpx / 1e6, "MPa");
        put(r, u, "TT-111", celsius(temperaturePH(pHpx, hHpx, 660)), "Cel");
        put(r, u, "PT-121", pCold / 1e6, "MPa");
        put(r, u, "TT-121", celsius(temperaturePH(pCold, hCold, 620)), "Cel");
        put(r, u, "PT-131", pHot / 1e6, "MPa");
        put(r, u, "TT-131", celsius(tHot), "Cel");
        put(r, u, "PT-141", pDa / 1e3, "kPa");
        put(r, u, "TT-141", celsius(temperaturePH(pDa, hDa, 660)), "Cel");
        put(r, u, "PT-151", pLpx / 1e3, "kPa");
        put(r, u, "TT-151", celsius(temperaturePH(pLpx, hLpx, 520)), "Cel");
        put(r, u, "PT-301", pCondenser / 1e3, "kPa");
        put(r, u, "PT-302", pCondenser / 1e3, "kPa");
        put(r, u, "PT-311", pCondensatePumped / 1e6, "MPa");
        put(r, u, "TT-311", celsius(temperaturePH(pCondensatePumped, hCondensatePumped, 315)), "Cel");
        put(r, u, "PT-321", pLpOut / 1e6, "MPa");
        put(r, u, "TT-321", celsius(tLpOut), "Cel");
        put(r, u, "PT-331", pLpDrain / 1e3, "kPa");
        put(r, u, "PT-341", pDrainPumped / 1e6, "MPa");
        put(r, u, "TT-341", celsius(temperaturePH(pDrainPumped, hDrainPumped, 400)), "Cel");
        put(r, u, "PT-401", pDeaerator / 1e5, "bar");
        put(r, u, "PT-411", pFeedPumped / 1e6, "MPa");
        put(r, u, "TT-411", celsius(temperaturePH(pFeedPumped, hFeedPumped, 450)), "Cel");
        put(r, u, "PT-421", pFeed / 1e6, "MPa");
        put(r, u, "TT-421", celsius(tFeed), "Cel");
        put(r, u, "FT-421", m * 3.6, "t/h");
        put(r, u, "PT-431", pHpDrain / 1e6, "MPa");
        put(r, u, "FT-501", coolingWaterFlow, "kg/s");
        put(r, u, "TT-501", celsius(tCoolingIn), "Cel");
        put(r, u, "TT-502", celsius(tCoolingOut), "Cel");
        put(r, u, "FT-900", (boilerHeat + reheatHeat) / (heatingValue * boilerEfficiency) * 3.6, "t/h");
        put(r, u, "JT-001", (hpWork + lpWork) * generatorEfficiency / 1e6, "MW");
        put(r, u, "JT-601", feedPumpWork / feedMotorEfficiency / 1e3, "kW");
        put(r, u, "JT-602", condensatePumpWork / condensateMotorEfficiency / 1e3, "kW");
        // the duplicate transmitters read what their primaries read
        for (String primary : List.of("PT-101", "TT-101", "PT-111", "TT-111", "PT-121", "TT-121", "PT-131", "TT-131",
                "TT-151", "PT-302", "PT-311", "PT-331", "TT-341", "PT-411", "PT-421", "TT-421", "PT-431", "FT-900",
                "JT-001", "JT-601", "JT-602")) {
            put(r, u, primary + "B", r.get(primary), u.get(primary));
        }
        return new ExampleOperatingPoint("regenerative.yaml", "fernholm/unit3/", r, u,
                List.of("cycle", "hp_turbine+lp_turbine+generator", "boiler+fuel", "condensate_pump+motor",
                        "feed_pump+motor"),
                new ExampleOperatingPoint.Figures(boilerHeat + reheatHeat, rejected, hpWork + lpWork,
                        condensatePumpWork + drainPumpWork + feedPumpWork));
    }

    /**
     * Unit 2 of {@code reheat.yaml}, instrumented in US customary units: 1800 psig / 1000 °F,
     * 8.0E5 lb/h, reheat from 450 psig to 1000 °F at 420 psig, condenser at 2 inHg absolute, feed
     * pump to 2100 psig. HP section efficiency 0.87, LP section 0.89, feed pump 0.80.
     */
    static ExampleOperatingPoint reheat() {
        double atmosphere = 29.77 * INCH_HG_PA;            // as in the file
        double coolingWaterPa = 20 * PSI_PA + atmosphere;  // 20 psig
        double generatorEfficiency = 0.985;
        double motorEfficiency = 0.95;
        double boilerEfficiency = 0.87;
        double heatingValue = 11800 * 1055.05585262 / POUND_KG; // Btu_IT/lb, NIST SP 811 (2008), B.8

        double m = 8.0e5 * POUND_KG / 3600.0;
        double pMain = 1800 * PSI_PA + atmosphere;
        double tMain = kelvinFromFahrenheit(1000);
        double pCold = 450 * PSI_PA + atmosphere;
        double pHot = 420 * PSI_PA + atmosphere;
        double tHot = kelvinFromFahrenheit(1000);
        double pExhaust = 2 * INCH_HG_PA;
        double pFeed = 2100 * PSI_PA + atmosphere;
        double tCoolingIn = kelvinFromFahrenheit(70);
        double tCoolingOut = kelvinFromFahrenheit(88);

        double hMain = h(pMain, tMain);
        double hCold = expand(hMain, s(pMain, tMain), pCold, 0.87, 600);
        double hHot = h(pHot, tHot);
        double hExhaust = expand(hHot, s(pHot, tHot), pExhaust, 0.89, 320);
        double hCondensate = hLiquid(pExhaust);
        double hFeed = pump(hCondensate, sLiquid(pExhaust), pFeed, 0.80, 315);

        double hpWork = m * (hMain - hCold);
        double lpWork = m * (hHot - hExhaust);
        double pumpWork = m * (hFeed - hCondensate);
        double boilerHeat = m * (hMain - hFeed);
        double reheatHeat = m * (hHot - hCold);
        double rejected = m * (hExhaust - hCondensate);
        double coolingWaterFlow = rejected / (h(coolingWaterPa, tCoolingOut) - h(coolingWaterPa, tCoolingIn));

        Map<String, Double> r = new LinkedHashMap<>();
        Map<String, String> u = new LinkedHashMap<>();
        put(r, u, "PT-201", (pMain - atmosphere) / PSI_PA, "psig");
        put(r, u, "TT-201", fahrenheit(tMain), "degF");
        put(r, u, "FT-201", poundsPerHour(m), "lb/h");
        put(r, u, "PT-211", (pCold - atmosphere) / PSI_PA, "psig");
        put(r, u, "TT-211", fahrenheit(temperaturePH(pCold, hCold, 600)), "degF");
        put(r, u, "PT-221", (pHot - atmosphere) / PSI_PA, "psig");
        put(r, u, "TT-221", fahrenheit(tHot), "degF");
        put(r, u, "PT-231", pExhaust / INCH_HG_PA, "inHg");
        put(r, u, "PT-232", pExhaust / INCH_HG_PA, "inHg");
        put(r, u, "PT-241", (pFeed - atmosphere) / PSI_PA, "psig");
        put(r, u, "TT-241", fahrenheit(temperaturePH(pFeed, hFeed, 315)), "degF");
        put(r, u, "FT-251", poundsPerHour(coolingWaterFlow), "lb/h");
        put(r, u, "TT-251", fahrenheit(tCoolingIn), "degF");
        put(r, u, "TT-252", fahrenheit(tCoolingOut), "degF");
        put(r, u, "FT-290", poundsPerHour((boilerHeat + reheatHeat) / (heatingValue * boilerEfficiency)), "lb/h");
        put(r, u, "JT-002", (hpWork + lpWork) * generatorEfficiency / 1e6, "MW");
        put(r, u, "JT-241", pumpWork / motorEfficiency / 1e3, "kW");
        return new ExampleOperatingPoint("reheat.yaml", "fernholm/unit2/", r, u,
                List.of("cycle", "hp_turbine+lp_turbine+generator", "boiler+fuel", "feed_pump+motor"),
                new ExampleOperatingPoint.Figures(boilerHeat + reheatHeat, rejected, hpWork + lpWork, pumpWork));
    }

    private static void put(Map<String, Double> readings, Map<String, String> units, String id, double value,
                            String unit) {
        readings.put(id, value);
        units.put(id, unit);
    }
}
