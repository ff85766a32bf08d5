package org.steamtally.calc.sim;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.CoolingWater;
import org.steamtally.calc.plant.FuelMeasurement;
import org.steamtally.calc.plant.MotorMeasurement;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.steam.If97Constants;
import org.steamtally.calc.steam.Steam;
import org.steamtally.calc.steam.SteamRangeException;
import org.steamtally.calc.steam.SteamState;

/**
 * The true operating state of a unit described by a plant description, at any load and
 * cooling-water temperature, built so that every balance the cycle model checks closes exactly
 * (to rounding) in the truth. Pure computation, no I/O; immutable and thread-safe.
 *
 * <h2>Pressures</h2>
 * At load L (main flow over design flow) the pressures along the steam path follow Stodola's cone
 * law (A. Stodola, <i>Steam and Gas Turbines</i>; the form recalled from memory and in common
 * practice for part-load turbine pressures): a stage group with inlet p_in and outlet p_out passes
 * m ∝ √((p_in² − p_out²)/(p_in·v_in)); with the inlet temperature held, p_in·v_in is nearly
 * constant, so p_in² = p_out² + L²·(p_in,d² − p_out,d²). It is applied from the condenser
 * upward: a turbine section's inlet and each extraction against the section's outlet, a
 * reheater's inlet against its outlet (the reheater's pressure drop scales the same way). The
 * condenser's saturation temperature keeps its design difference above the cooling-water inlet
 * temperature. A closed heater's shell (drain) and an open heater fed by a turbine port keep their
 * design pressure ratio to that steam; every other state (pump discharges, feedwater) keeps its
 * design pressure.
 *
 * <h2>Temperatures and enthalpies</h2>
 * Temperatures given in the design point are held, except at heater and condenser outlets fixed by
 * (p, T), which keep their design difference to the saturation temperature of their shell, and at
 * pump outlets, which keep their design rise over the pump's inlet temperature. Turbine
 * and pump outlets whose temperature is not given, and states fixed by an energy balance (the wet
 * exhaust), follow from the component's isentropic efficiency, held at its design value: for a
 * turbine h = h_in − η (h_in − h_s(p, s_in)) at each extraction and the outlet, for a pump
 * h = h_in + (h_s − h_in)/η. A temperature found from an enthalpy is refined on the forward IF97
 * equation so that h(p, T) gives the enthalpy back exactly, as the cycle model will compute it.
 *
 * <h2>Flows and derived sensors</h2>
 * The reference flows scale with L; every other flow solves the mass balances and the adiabatic
 * heater and mixer energy balances (least squares, exact for this consistent system). The
 * generator reads η_gen · (Σ turbine work − casing losses), a pump motor W_pump / η_motor, the
 * cooling-water outlet temperature follows from the condenser duty m_cw·(h_out − h_in) at the
 * cooling-water pressure, and the fuel flow is the heat into the working fluid (steam generator,
 * plus reheaters when there is one steam generator, as the cycle model counts it) over η_boiler·HV.
 * Cooling-water flow is held at its design value.
 */
public final class TruthModel {

    /** A flow system with a diagonal of R below this fraction of the largest leaves a flow free. */
    private static final double RANK_TOLERANCE = 1e-10;
    /** Energy rows in MJ/kg so that their coefficients are of order one, like the mass rows. */
    private static final double ENERGY_ROW_SCALE = 1e-6;
    /** Mixed enthalpies settled to this, J/kg, are exact to rounding for the balances (1e-9 of h). */
    private static final double MIXING_TOLERANCE_J_PER_KG = 1e-6;
    private static final int MAX_MIXING_PASSES = 100;
    /** A balance missing by more than this fraction of the largest flow is not rounding. */
    private static final double CONSISTENCY_TOLERANCE = 1e-9;

    private enum TemperatureRule { HELD, SATURATION_MARGIN, PUMP_RISE, EXPANSION, PUMPED, SATURATED, MIXED }

    private final UnitDescription unit;
    private final DesignPoint design;
    private final List<String> sensorIds;
    private final Map<String, Integer> sensorIndex = new HashMap<>();
    private final int n;
    private final String[] id;
    private final StateFix[] fix;
    private final Map<String, Integer> stateIndex = new HashMap<>();
    private final Component[] source;
    private final Component[] sink;
    private final double[] designPressure;
    private final double[] designTemperature;
    private final TemperatureRule[] rule;
    /** For SATURATION_MARGIN: the state whose pressure is the shell's, and the design margin, K. */
    private final int[] shell;
    private final double[] designMargin;
    /** For PUMP_RISE: the design temperature rise across the pump, K; NaN until the design point is solved. */
    private final double[] designRise;
    private final double[] referenceFlow;
    private final List<int[]> massRows = new ArrayList<>();
    private final List<int[]> energyRows = new ArrayList<>();
    private final List<double[]> massSigns = new ArrayList<>();
    private final List<double[]> energySigns = new ArrayList<>();

    private TruthModel(UnitDescription unit, DesignPoint design) {
        this.unit = Objects.requireNonNull(unit, "unit");
        this.design = Objects.requireNonNull(design, "design");
        List<String> problems = new ArrayList<>();
        sensorIds = unit.sensors().stream().map(Sensor::id).toList();
        for (int i = 0; i < sensorIds.size(); i++) {
            sensorIndex.put(sensorIds.get(i), i);
        }
        List<StateDefinition> flowing = unit.states().stream().filter(s -> !s.isReference()).toList();
        n = flowing.size();
        id = new String[n];
        fix = new StateFix[n];
        source = new Component[n];
        sink = new Component[n];
        designPressure = new double[n];
        designTemperature = new double[n];
        rule = new TemperatureRule[n];
        shell = new int[n];
        designMargin = new double[n];
        designRise = new double[n];
        Arrays.fill(designRise, Double.NaN);
        referenceFlow = new double[n];
        for (int j = 0; j < n; j++) {
            id[j] = flowing.get(j).id();
            fix[j] = flowing.get(j).fix();
            stateIndex.put(id[j], j);
            shell[j] = -1;
        }
        for (Component c : unit.components()) {
            for (String s : c.outlets()) {
                Integer j = stateIndex.get(s);
                if (j != null) {
                    source[j] = c;
                }
            }
            for (String s : c.inlets()) {
                Integer j = stateIndex.get(s);
                if (j != null) {
                    sink[j] = c;
                }
            }
        }
        for (int j = 0; j < n; j++) {
            if (source[j] == null || sink[j] == null) {
                problems.add("state \"" + id[j] + "\" does not connect two components");
            }
        }
        design.referenceFlows().forEach((state, m) -> {
            Integer j = stateIndex.get(state);
            if (j == null) {
                problems.add("design flow given for \"" + state + "\", which is not a flowing state of the unit");
            } else {
                referenceFlow[j] = m;
            }
        });
        for (String sensor : design.sensorValuesSi().keySet()) {
            if (!sensorIndex.containsKey(sensor)) {
                problems.add("design value given for sensor \"" + sensor + "\", which is not a sensor of the unit");
            }
        }
        for (String component : design.isentropicEfficiencies().keySet()) {
            Component c = unit.component(component).orElse(null);
            if (!(c instanceof Component.TurbineSection) && !(c instanceof Component.Pump)) {
                problems.add("isentropic efficiency given for \"" + component + "\", which is not a turbine section or pump of the unit");
            }
        }
        design.flowMeters().forEach((sensor, state) -> {
            if (!sensorIndex.containsKey(sensor)) {
                problems.add("flow meter \"" + sensor + "\" is not a sensor of the unit");
            }
            if (!stateIndex.containsKey(state)) {
                problems.add("flow meter \"" + sensor + "\" is given for \"" + state + "\", which is not a flowing state");
            }
        });
        if (problems.isEmpty()) {
            assignRules(problems);
        }
        if (problems.isEmpty()) {
            checkDerivedSensors(problems);
            buildRows();
        }
        if (!problems.isEmpty()) {
            throw new TruthModelException(unit.id(), problems);
        }
        // The design point itself must be a physical state. A pump outlet whose temperature is given
        // keeps its design rise over the inlet, which the design point's inlet temperature fixes.
        TruthPoint first = at(OperatingConditions.DESIGN);
        for (int j = 0; j < n; j++) {
            if (rule[j] == TemperatureRule.PUMP_RISE) {
                String inlet = source[j].inlets().get(0);
                designRise[j] = designTemperature[j] - first.state(inlet).temperatureK();
            }
        }
    }

    /**
     * Checks a design point against its unit and prepares the truth model.
     *
     * @throws TruthModelException naming every missing, surplus or inconsistent design value
     */
    public static TruthModel of(UnitDescription unit, DesignPoint design) {
        return new TruthModel(unit, design);
    }

    public UnitDescription unit() {
        return unit;
    }

    public DesignPoint design() {
        return design;
    }

    private static String pressureSensorOf(StateFix f) {
        if (f instanceof StateFix.MeasuredPressureTemperature pt) {
            return pt.pressureSensor();
        } else if (f instanceof StateFix.SaturatedLiquid sl) {
            return sl.pressureSensor();
        } else if (f instanceof StateFix.SaturatedVapour sv) {
            return sv.pressureSensor();
        } else if (f instanceof StateFix.PressureQuality pq) {
            return pq.pressureSensor();
        }
        if (f instanceof StateFix.EnergyBalance eb) {
            return eb.pressureSensor();
        }
        throw new IllegalArgumentException("the truth model does not know the state fix " + f);
    }

    private void assignRules(List<String> problems) {
        Map<String, Double> values = design.sensorValuesSi();
        for (int j = 0; j < n; j++) {
            String ps = pressureSensorOf(fix[j]);
            Double p = values.get(ps);
            if (p == null) {
                problems.add("state \"" + id[j] + "\": design value of its pressure sensor \"" + ps + "\" is missing");
                continue;
            }
            if (!(p > Steam.TRIPLE_POINT_PRESSURE_PA && p < Steam.MAX_PRESSURE_PA)) {
                problems.add("state \"" + id[j] + "\": design pressure " + p + " Pa of \"" + ps
                        + "\" is outside 611.2 Pa to 100 MPa");
                continue;
            }
            designPressure[j] = p;
            Double eta = design.isentropicEfficiencies().get(source[j].id());
            if (fix[j] instanceof StateFix.MeasuredPressureTemperature pt) {
                Double t = values.get(pt.temperatureSensor());
                if (t != null) {
                    designTemperature[j] = t;
                    if (source[j] instanceof Component.ClosedFeedwaterHeater h) {
                        rule[j] = TemperatureRule.SATURATION_MARGIN;
                        shell[j] = stateIndex.get(h.drainOutlet());
                    } else if (source[j] instanceof Component.OpenFeedwaterHeater
                            || source[j] instanceof Component.Condenser) {
                        rule[j] = TemperatureRule.SATURATION_MARGIN;
                        shell[j] = j;
                    } else if (source[j] instanceof Component.Pump) {
                        rule[j] = TemperatureRule.PUMP_RISE;
                    } else {
                        rule[j] = TemperatureRule.HELD;
                    }
                } else if (eta != null && source[j] instanceof Component.TurbineSection) {
                    rule[j] = TemperatureRule.EXPANSION;
                } else if (eta != null && source[j] instanceof Component.Pump) {
                    rule[j] = TemperatureRule.PUMPED;
                } else {
                    problems.add("state \"" + id[j] + "\": give the design value of its temperature sensor \""
                            + pt.temperatureSensor() + "\""
                            + (source[j] instanceof Component.TurbineSection || source[j] instanceof Component.Pump
                            ? " or the isentropic efficiency of \"" + source[j].id() + "\"" : ""));
                }
            } else if (fix[j] instanceof StateFix.EnergyBalance eb) {
                if (source[j] instanceof Component.Mixer x && x.id().equals(eb.componentId())) {
                    rule[j] = TemperatureRule.MIXED;
                } else if (eta != null && source[j] instanceof Component.TurbineSection) {
                    rule[j] = TemperatureRule.EXPANSION;
                } else if (eta != null && source[j] instanceof Component.Pump) {
                    rule[j] = TemperatureRule.PUMPED;
                } else {
                    problems.add("state \"" + id[j] + "\" is fixed by an energy balance: its truth needs the isentropic"
                            + " efficiency of the turbine section or pump it leaves, and it leaves \"" + source[j].id()
                            + "\"" + (source[j] instanceof Component.TurbineSection || source[j] instanceof Component.Pump
                            ? ", whose efficiency is not given" : ", which is neither"));
                }
            } else {
                rule[j] = TemperatureRule.SATURATED;
            }
        }
        for (int j = 0; j < n && problems.isEmpty(); j++) {
            if (rule[j] == TemperatureRule.SATURATION_MARGIN) {
                double pShell = designPressure[shell[j]];
                if (pShell >= If97Constants.CRITICAL_PRESSURE_PA) {
                    problems.add("state \"" + id[j] + "\": shell pressure " + pShell + " Pa is above the critical pressure");
                } else {
                    designMargin[j] = Steam.saturationTemperature(pShell) - designTemperature[j];
                }
            }
        }
    }

    private void checkDerivedSensors(List<String> problems) {
        Map<String, Double> values = design.sensorValuesSi();
        List<String> derived = new ArrayList<>();
        List<String> needed = new ArrayList<>();
        for (int j = 0; j < n; j++) {
            unit.state(id[j]).flatMap(StateDefinition::flowSensor).ifPresent(derived::add);
            if (rule[j] == TemperatureRule.EXPANSION || rule[j] == TemperatureRule.PUMPED) {
                if (fix[j] instanceof StateFix.MeasuredPressureTemperature pt) {
                    derived.add(pt.temperatureSensor());
                }
            }
        }
        derived.addAll(design.flowMeters().keySet());
        // a duplicate transmitter reads its primary's truth (with its own noise and faults in the simulator)
        unit.sensors().stream().filter(Sensor::isDuplicate).map(Sensor::id).forEach(derived::add);
        for (Component c : unit.components()) {
            if (c instanceof Component.Generator g) {
                derived.add(g.powerSensor());
            } else if (c instanceof Component.Pump p && p.motor().isPresent()) {
                derived.add(p.motor().get().powerSensor());
            } else if (c instanceof Component.SteamGenerator sg && sg.fuel().isPresent()) {
                derived.add(sg.fuel().get().flowSensor());
            } else if (c instanceof Component.Condenser cd && cd.coolingWater().isPresent()) {
                CoolingWater cw = cd.coolingWater().get();
                derived.add(cw.outletTemperatureSensor());
                needed.add(cw.flowSensor());
                needed.add(cw.inletTemperatureSensor());
            }
        }
        for (String s : derived) {
            if (values.containsKey(s)) {
                problems.add("sensor \"" + s + "\" follows from the balances; leave its design value out");
            }
        }
        for (String s : needed) {
            if (!values.containsKey(s)) {
                problems.add("design value of cooling-water sensor \"" + s + "\" is missing");
            }
        }
        for (String s : sensorIds) {
            boolean used = derived.contains(s) || values.containsKey(s);
            if (!used) {
                problems.add("sensor \"" + s + "\" has no truth: no state or balance gives it, so give its design value"
                        + " (held constant) or name the state it meters as a flow meter");
            }
        }
        for (Component c : unit.components()) {
            if (c instanceof Component.Generator g && design.turbineCasingLossFraction() > 0.0) {
                for (int j = 0; j < n; j++) {
                    if (fix[j] instanceof StateFix.EnergyBalance eb && (eb.componentId().equals(g.id())
                            || g.turbines().contains(eb.componentId()))) {
                        problems.add("a turbine casing loss needs generator \"" + g.id()
                                + "\" to be an independent check, but it fixes state \"" + id[j] + "\"");
                    }
                }
            }
        }
    }

    private void buildRows() {
        for (Component c : unit.components()) {
            if (c instanceof Component.Generator) {
                continue;
            }
            if (c instanceof Component.ClosedFeedwaterHeater h) {
                addMass(List.of(h.feedwaterInlet()), List.of(h.feedwaterOutlet()));
                List<String> shellIn = new ArrayList<>();
                shellIn.add(h.steamInlet());
                shellIn.addAll(h.drainInlets());
                addMass(shellIn, List.of(h.drainOutlet()));
            } else {
                addMass(c.inlets(), c.outlets());
            }
            boolean mixing = c instanceof Component.Mixer x && rule[stateIndex.get(x.outlet())] == TemperatureRule.MIXED;
            if (c instanceof Component.OpenFeedwaterHeater || c instanceof Component.Mixer && !mixing
                    || c instanceof Component.ClosedFeedwaterHeater) {
                // A mixed outlet's m h is its mixer's Σ m_in h_in, which keeps the rows linear in the flows.
                List<Integer> js = new ArrayList<>();
                List<Double> sg = new ArrayList<>();
                for (int pass = 0; pass < 2; pass++) {
                    double sign = pass == 0 ? 1.0 : -1.0;
                    for (String port : pass == 0 ? c.inlets() : c.outlets()) {
                        int j = stateIndex.get(port);
                        List<String> terms = rule[j] == TemperatureRule.MIXED ? source[j].inlets() : List.of(port);
                        for (String t : terms) {
                            js.add(stateIndex.get(t));
                            sg.add(sign);
                        }
                    }
                }
                energyRows.add(js.stream().mapToInt(Integer::intValue).toArray());
                energySigns.add(sg.stream().mapToDouble(Double::doubleValue).toArray());
            }
        }
    }

    private void addMass(List<String> in, List<String> out) {
        int[] js = new int[in.size() + out.size()];
        double[] sg = new double[js.length];
        int k = 0;
        for (String s : in) {
            js[k] = stateIndex.get(s);
            sg[k++] = 1.0;
        }
        for (String s : out) {
            js[k] = stateIndex.get(s);
            sg[k++] = -1.0;
        }
        massRows.add(js);
        massSigns.add(sg);
    }

    /** The design point: full load, design cooling-water temperature. */
    public TruthPoint atDesign() {
        return at(OperatingConditions.DESIGN);
    }

    /**
     * The true values at an operating point.
     *
     * @throws TruthModelException when the unit has no physical state there (a negative flow, a
     *                             (p, T)-fixed state that would be wet, a state outside IF97)
     */
    public TruthPoint at(OperatingConditions conditions) {
        Evaluation e = new Evaluation(conditions);
        try {
            return e.run();
        } catch (SteamRangeException | IllegalStateException ex) {
            throw new TruthModelException(unit.id(), List.of("at load " + conditions.loadFraction()
                    + " and cooling-water shift " + conditions.coolingWaterInletShiftK() + " K a state is outside IF97: "
                    + ex.getMessage()));
        }
    }

    /** One evaluation's working arrays. */
    private final class Evaluation {
        private final double load;
        private final double shift;
        private final double[] p = new double[n];
        private final boolean[] pDone = new boolean[n];
        private final boolean[] pBusy = new boolean[n];
        private final double[] t = new double[n];
        private final double[] h = new double[n];
        private final double[] s = new double[n];
        private final boolean[] hDone = new boolean[n];
        private final double[] m = new double[n];
        private final double[] mixedEnthalpy = new double[n];
        private final List<String> problems = new ArrayList<>();

        Evaluation(OperatingConditions conditions) {
            load = conditions.loadFraction();
            shift = conditions.coolingWaterInletShiftK();
        }

        TruthPoint run() {
            for (int j = 0; j < n; j++) {
                pressure(j);
            }
            // A sensor shared by two states reads one value: the first state's.
            Map<String, Integer> firstOfSensor = new HashMap<>();
            for (int j = 0; j < n; j++) {
                Integer first = firstOfSensor.putIfAbsent(pressureSensorOf(fix[j]), j);
                if (first != null) {
                    p[j] = p[first];
                }
            }
            Arrays.fill(mixedEnthalpy, Double.NaN);
            // A mixed outlet's enthalpy needs the flows, and states downstream of it may enter the
            // balances that give the flows: iterate to the fixed point (one pass without mixers).
            for (int pass = 0; ; pass++) {
                Arrays.fill(hDone, false);
                enthalpies();
                fail();
                flows();
                fail();
                double change = 0.0;
                for (int j = 0; j < n; j++) {
                    if (rule[j] == TemperatureRule.MIXED) {
                        Component x = source[j];
                        double sum = 0.0;
                        for (String inlet : x.inlets()) {
                            int k = stateIndex.get(inlet);
                            sum += m[k] * h[k];
                        }
                        double mixed = sum / m[j];
                        change = Math.max(change, Math.abs(mixed - mixedEnthalpy[j]));
                        mixedEnthalpy[j] = mixed;
                    }
                }
                if (change == 0.0 || change < MIXING_TOLERANCE_J_PER_KG && pass > 0) {
                    if (change > 0.0) {
                        Arrays.fill(hDone, false);
                        enthalpies();
                        flows();
                        fail();
                    }
                    break;
                }
                if (pass == MAX_MIXING_PASSES) {
                    problems.add("the mixing of mixer outlets does not settle " + where() + " after " + pass
                            + " passes (last change " + change + " J/kg)");
                    fail();
                }
            }
            return assemble();
        }

        private void fail() {
            if (!problems.isEmpty()) {
                throw new TruthModelException(unit.id(), problems);
            }
        }

        private String where() {
            return "at load " + load + " and cooling-water shift " + shift + " K";
        }

        private double cone(int j, int downstream) {
            double pd = designPressure[j];
            double po = pressure(downstream);
            double pod = designPressure[downstream];
            double span = pd * pd - pod * pod;
            if (!(span > 0.0)) {
                problems.add("state \"" + id[j] + "\": its design pressure " + pd + " Pa must be above that of \""
                        + id[downstream] + "\", " + pod + " Pa, downstream of it on the steam path");
                return pd;
            }
            return Math.sqrt(po * po + load * load * span);
        }

        private double pressure(int j) {
            if (pDone[j]) {
                return p[j];
            }
            if (pBusy[j]) {
                problems.add("state \"" + id[j] + "\": the steam path loops back on itself");
                return designPressure[j];
            }
            pBusy[j] = true;
            double result = designPressure[j];
            Component in = sink[j];
            Component from = source[j];
            if (in instanceof Component.TurbineSection ts) {
                result = cone(j, stateIndex.get(ts.outlet()));
            } else if (from instanceof Component.TurbineSection ts && !ts.outlet().equals(id[j])) {
                result = cone(j, stateIndex.get(ts.outlet()));
            } else if (in instanceof Component.Reheater r) {
                result = cone(j, stateIndex.get(r.outlet()));
            } else if (from instanceof Component.ClosedFeedwaterHeater hx && hx.drainOutlet().equals(id[j])) {
                int steam = stateIndex.get(hx.steamInlet());
                result = designPressure[j] * pressure(steam) / designPressure[steam];
            } else if (from instanceof Component.OpenFeedwaterHeater oh) {
                for (String inlet : oh.inlets()) {
                    int k = stateIndex.get(inlet);
                    if (source[k] instanceof Component.TurbineSection) {
                        result = designPressure[j] * pressure(k) / designPressure[k];
                        break;
                    }
                }
            } else if (in instanceof Component.Condenser c && c.coolingWater().isPresent()) {
                result = designPressure[j] * condenserRatio(c);
            } else if (from instanceof Component.Condenser c && c.coolingWater().isPresent()) {
                result = designPressure[j] * condenserRatio(c);
            }
            p[j] = result;
            pDone[j] = true;
            pBusy[j] = false;
            return result;
        }

        /** p_cond / p_cond,d with the saturation temperature kept its design distance above the cooling water. */
        private double condenserRatio(Component.Condenser c) {
            double pd = designPressure[stateIndex.get(c.outlet())];
            double tsat = Steam.saturationTemperature(pd) + shift;
            return Steam.saturationPressure(tsat) / pd;
        }

        private void enthalpies() {
            boolean progress = true;
            while (progress) {
                progress = false;
                for (int j = 0; j < n; j++) {
                    if (!hDone[j] && tryEnthalpy(j)) {
                        hDone[j] = true;
                        progress = true;
                    }
                }
            }
            for (int j = 0; j < n; j++) {
                if (!hDone[j] && problems.isEmpty()) {
                    problems.add("state \"" + id[j] + "\": its enthalpy depends on itself through isentropic efficiencies");
                }
            }
        }

        private boolean tryEnthalpy(int j) {
            switch (rule[j]) {
                case HELD -> setPT(j, designTemperature[j]);
                case PUMP_RISE -> {
                    int in = stateIndex.get(source[j].inlets().get(0));
                    if (!hDone[in]) {
                        return false;
                    }
                    setPT(j, Double.isNaN(designRise[j]) ? designTemperature[j] : t[in] + designRise[j]);
                }
                case SATURATION_MARGIN -> setPT(j, Steam.saturationTemperature(p[shell[j]]) - designMargin[j]);
                case MIXED -> {
                    // The previous pass's mixing, or for the first pass the mean of the inlets.
                    if (Double.isNaN(mixedEnthalpy[j])) {
                        double sum = 0.0;
                        for (String inlet : source[j].inlets()) {
                            int k = stateIndex.get(inlet);
                            if (!hDone[k]) {
                                return false;
                            }
                            sum += h[k];
                        }
                        mixedEnthalpy[j] = sum / source[j].inlets().size();
                    }
                    SteamState st = Steam.statePH(p[j], mixedEnthalpy[j]);
                    t[j] = st.temperatureK();
                    h[j] = mixedEnthalpy[j];
                    s[j] = st.entropyJPerKgK();
                }
                case SATURATED -> {
                    double x = fix[j] instanceof StateFix.SaturatedLiquid ? 0.0
                            : fix[j] instanceof StateFix.SaturatedVapour ? 1.0 : ((StateFix.PressureQuality) fix[j]).quality();
                    SteamState st = Steam.statePX(p[j], x);
                    t[j] = st.temperatureK();
                    h[j] = st.enthalpyJPerKg();
                    s[j] = st.entropyJPerKgK();
                }
                default -> {
                    int in = stateIndex.get(source[j].inlets().get(0));
                    if (!hDone[in]) {
                        return false;
                    }
                    double eta = design.isentropicEfficiencies().get(source[j].id());
                    double hs = Steam.statePS(p[j], s[in]).enthalpyJPerKg();
                    double target = rule[j] == TemperatureRule.EXPANSION ? h[in] - eta * (h[in] - hs)
                            : h[in] + (hs - h[in]) / eta;
                    if (fix[j] instanceof StateFix.MeasuredPressureTemperature) {
                        setPH(j, target);
                    } else {
                        SteamState st = Steam.statePH(p[j], target);
                        t[j] = st.temperatureK();
                        h[j] = target;
                        s[j] = st.entropyJPerKgK();
                    }
                }
            }
            return true;
        }

        private void setPT(int j, double temperature) {
            t[j] = temperature;
            h[j] = Steam.enthalpyPT(p[j], temperature);
            s[j] = Steam.entropyPT(p[j], temperature);
        }

        /** A (p, T)-fixed state at a given enthalpy: T by the backward equation, refined on the forward one. */
        private void setPH(int j, double target) {
            SteamState st = Steam.statePH(p[j], target);
            if (st.quality().isPresent()) {
                problems.add("state \"" + id[j] + "\" would be wet " + where() + " (quality "
                        + st.quality().getAsDouble() + "), which its measured p, T fix cannot describe");
                return;
            }
            double temperature = st.temperatureK();
            for (int k = 0; k < 4; k++) {
                SteamState f = Steam.statePT(p[j], temperature);
                temperature -= (f.enthalpyJPerKg() - target) / f.isobaricHeatCapacityJPerKgK().getAsDouble();
            }
            setPT(j, temperature);
        }

        private void flows() {
            int rows = massRows.size() + energyRows.size() + design.referenceFlows().size();
            double[][] a = new double[rows][n];
            double[] b = new double[rows];
            int r = 0;
            for (int k = 0; k < massRows.size(); k++, r++) {
                int[] js = massRows.get(k);
                for (int q = 0; q < js.length; q++) {
                    a[r][js[q]] += massSigns.get(k)[q];
                }
            }
            for (int k = 0; k < energyRows.size(); k++, r++) {
                int[] js = energyRows.get(k);
                for (int q = 0; q < js.length; q++) {
                    a[r][js[q]] += energySigns.get(k)[q] * h[js[q]] * ENERGY_ROW_SCALE;
                }
            }
            for (int j = 0; j < n; j++) {
                if (referenceFlow[j] > 0.0) {
                    a[r][j] = 1.0;
                    b[r++] = load * referenceFlow[j];
                }
            }
            double[][] a0 = new double[rows][];
            for (int k = 0; k < rows; k++) {
                a0[k] = a[k].clone();
            }
            double[] b0 = b.clone();
            double[] x = LeastSquares.solve(a, b, RANK_TOLERANCE);
            if (x == null) {
                problems.add("the reference flows " + design.referenceFlows().keySet()
                        + " and the mass and heater balances do not fix every flow; give the flow of one more state");
                return;
            }
            double largest = 0.0;
            for (double v : x) {
                largest = Math.max(largest, Math.abs(v));
            }
            // The system is consistent for any plant the cycle model accepts (its balances are square);
            // a residual far above rounding means a balance the held design temperatures cannot meet.
            for (int k = 0; k < rows; k++) {
                double residual = -b0[k];
                for (int j = 0; j < n; j++) {
                    residual += a0[k][j] * x[j];
                }
                if (Math.abs(residual) > CONSISTENCY_TOLERANCE * largest) {
                    problems.add("the mass and heater balances cannot all hold " + where() + " (row " + k
                            + " misses by " + residual + " kg/s): a mixer or heater outlet temperature in the design"
                            + " point is over-determined by its inlets");
                    return;
                }
            }
            for (int j = 0; j < n; j++) {
                m[j] = x[j];
                if (!(x[j] > 0.0)) {
                    problems.add("the balances give state \"" + id[j] + "\" a flow of " + x[j] + " kg/s " + where());
                }
            }
        }

        /** Σ m_out h_out − Σ m_in h_in over a component's ports, W. */
        private double steamSide(Component c) {
            double sum = 0.0;
            for (String o : c.outlets()) {
                int j = stateIndex.get(o);
                sum += m[j] * h[j];
            }
            for (String i : c.inlets()) {
                int j = stateIndex.get(i);
                sum -= m[j] * h[j];
            }
            return sum;
        }

        private TruthPoint assemble() {
            double[] v = new double[sensorIds.size()];
            boolean[] set = new boolean[v.length];
            for (Map.Entry<String, Double> e : design.sensorValuesSi().entrySet()) {
                put(v, set, e.getKey(), e.getValue());
            }
            for (int j = 0; j < n; j++) {
                put(v, set, pressureSensorOf(fix[j]), p[j]);
                if (fix[j] instanceof StateFix.MeasuredPressureTemperature pt) {
                    put(v, set, pt.temperatureSensor(), t[j]);
                }
                final int state = j;
                unit.state(id[j]).flatMap(StateDefinition::flowSensor).ifPresent(f -> put(v, set, f, m[state]));
            }
            design.flowMeters().forEach((sensor, state) -> put(v, set, sensor, m[stateIndex.get(state)]));
            double added = 0.0;
            double rejected = 0.0;
            double turbine = 0.0;
            double pump = 0.0;
            long steamGenerators = unit.components().stream().filter(c -> c instanceof Component.SteamGenerator).count();
            double reheat = 0.0;
            for (Component c : unit.components()) {
                if (c instanceof Component.Reheater) {
                    reheat += steamSide(c);
                }
            }
            Map<String, Double> expected = new LinkedHashMap<>();
            double casingTotal = 0.0;
            for (Component c : unit.components()) {
                if (c instanceof Component.SteamGenerator sg) {
                    double q = steamSide(c);
                    added += q;
                    if (sg.fuel().isPresent()) {
                        FuelMeasurement fuel = sg.fuel().get();
                        double heat = q + (steamGenerators == 1 ? reheat : 0.0);
                        put(v, set, fuel.flowSensor(), heat / (fuel.boilerEfficiency().value()
                                * fuel.heatingValueJPerKg().value()));
                    }
                } else if (c instanceof Component.Reheater) {
                    added += steamSide(c);
                } else if (c instanceof Component.Condenser cd) {
                    double q = -steamSide(c);
                    rejected += q;
                    if (cd.coolingWater().isPresent()) {
                        CoolingWater cw = cd.coolingWater().get();
                        double mcw = design.sensorValuesSi().get(cw.flowSensor());
                        double tIn = design.sensorValuesSi().get(cw.inletTemperatureSensor()) + shift;
                        put(v, set, cw.inletTemperatureSensor(), tIn);
                        double hOut = Steam.enthalpyPT(cw.pressurePa(), tIn) + q / mcw;
                        put(v, set, cw.outletTemperatureSensor(), coolingWaterTemperature(cw.pressurePa(), hOut, tIn));
                    }
                } else if (c instanceof Component.TurbineSection) {
                    double w = -steamSide(c);
                    if (!(w > 0.0)) {
                        problems.add("turbine section \"" + c.id() + "\" would do no work " + where() + ": " + w + " W");
                    }
                    turbine += w;
                } else if (c instanceof Component.Pump pu) {
                    double w = steamSide(c);
                    if (!(w > 0.0)) {
                        problems.add("pump \"" + c.id() + "\" would take no work " + where() + ": " + w
                                + " W; its outlet is too cold for its inlet");
                    }
                    pump += w;
                    if (pu.motor().isPresent()) {
                        MotorMeasurement motor = pu.motor().get();
                        put(v, set, motor.powerSensor(), w / motor.efficiency().value());
                    }
                } else if (c instanceof Component.Generator g) {
                    double shaft = 0.0;
                    double loss = 0.0;
                    for (String ts : g.turbines()) {
                        double w = -steamSide(unit.component(ts).orElseThrow());
                        shaft += w;
                        loss += design.turbineCasingLossFraction() * w;
                    }
                    put(v, set, g.powerSensor(), g.efficiency().value() * (shaft - loss));
                    if (loss > 0.0) {
                        expected.put(String.join("+", g.turbines()) + "+" + g.id(), loss);
                        casingTotal += loss;
                    }
                }
            }
            for (Sensor sensor : unit.sensors()) {
                if (sensor.isDuplicate()) {
                    Integer primary = sensorIndex.get(sensor.sameMeasurandAs().get());
                    if (primary != null) {
                        put(v, set, sensor.id(), v[primary]);
                    }
                }
            }
            fail();
            if (casingTotal > 0.0) {
                expected.put("cycle", casingTotal);
            }
            List<TruthState> states = new ArrayList<>(n);
            for (int j = 0; j < n; j++) {
                states.add(new TruthState(id[j], p[j], t[j], h[j], m[j]));
            }
            return new TruthPoint(new OperatingConditions(load, shift), sensorIds, v, states,
                    new TruthFigures(added, rejected, turbine, pump), expected);
        }

        /** The cooling water's outlet temperature at enthalpy h, Newton on the forward equation from T_in. */
        private double coolingWaterTemperature(double pressurePa, double target, double start) {
            double temperature = start;
            for (int k = 0; k < 8; k++) {
                SteamState f = Steam.statePT(pressurePa, temperature);
                double step = (f.enthalpyJPerKg() - target) / f.isobaricHeatCapacityJPerKgK().getAsDouble();
                temperature -= step;
                if (Math.abs(step) < 1e-12 * temperature) {
                    break;
                }
            }
            return temperature;
        }

        private void put(double[] v, boolean[] set, String sensor, double value) {
            Integer i = sensorIndex.get(sensor);
            if (i != null) {
                v[i] = value;
                set[i] = true;
            }
        }
    }
}
