package org.steamtally.calc.cycle;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.SplittableRandom;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.CoolingWater;
import org.steamtally.calc.plant.FuelMeasurement;
import org.steamtally.calc.plant.MotorMeasurement;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.SensorUncertainties;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UncertainConstant;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.steam.If97Constants;
import org.steamtally.calc.steam.Steam;
import org.steamtally.calc.steam.SteamRangeException;

/**
 * The first-law and second-law model of one unit: from one aligned {@link Snapshot} of its sensors
 * to its {@link UnitResult}: every state, every component's heat and work, the cycle's figures of
 * merit, and the closure of every balance that two independent measurements can check.
 *
 * <h2>States</h2>
 * Properties by IAPWS-IF97 (IAPWS R7-97(2012)) in SI units. A state is fixed by its
 * {@link StateFix}: measured (p, T); saturated liquid or vapour at a measured p; p with a declared
 * quality; p with the enthalpy from the energy balance of one component against that component's
 * independent measurement (a condenser's cooling-water duty, the generator output of a turbine's
 * shaft, a pump's motor power, a steam generator's fuel heat); p with the enthalpy of adiabatic
 * mixing, h_out = Σ m_in h_in / m_out, for a mixer's outlet that names its own mixer (computed once
 * the flows are solved; in every other heater or mixer balance its m h is replaced by the mixer's
 * Σ m_in h_in, which keeps the flow system linear, and the mixer adds no energy balance of its own);
 * or an ideal reference, the entropy of one state at the pressure of another, which carries no flow.
 * Each state's expected phase follows
 * from the ports it sits on: turbine inlets, extractions and outlets, steam-generator outlets,
 * reheater ports and closed-heater steam inlets cannot be compressed liquid; pump ports,
 * closed-heater feedwater ports, steam-generator inlets and condenser outlets cannot be
 * superheated vapour or a wet mixture.
 *
 * <h2>Flows</h2>
 * Every flowing state has one mass flow, from its flow sensor or solved from the balances: the mass
 * balance of every component (pass-through components carry one flow; a turbine section
 * m_in = m_out + Σ m_ext; condensers, open heaters and mixers Σ m_in = m_out; a closed heater one
 * balance for the feedwater and one for the shell) and the adiabatic energy balance of every open
 * heater and mixer (Σ m_in h_in = m_out h_out) and closed heater
 * (m_steam h_steam + Σ m_drain,in h_drain,in − m_drain,out h_drain,out = m_fw (h_fw,out − h_fw,in)).
 * One mass balance per closed loop is implied by the others and dropped. {@link #compile} requires
 * the remaining system to be square and structurally non-singular (checked at random enthalpies,
 * which exposes every structural rank deficit with probability one); a flow sensor whose flow the
 * balances already fix is rejected: redundant flow measurements are not reconciled.
 *
 * <h2>Components</h2>
 * {@code heat_in_W} positive into the working fluid, {@code work_out_W} positive out of it; the
 * steady-flow energy balance Q − W = Σ m_out h_out − Σ m_in h_in gives both. Isentropic efficiency
 * (h_in − h_out)/(h_in − h_s) for a turbine section and (h_s − h_in)/(h_out − h_in) for a pump,
 * where an ideal outlet is declared. Exergy destruction I = T0 · S_gen with
 * S_gen = Σ m_out s_out − Σ m_in s_in − Q/T_b and T0 of the unit's dead state. The boundary
 * temperature T_b is: for a condenser, the entropic mean temperature of the cooling water
 * (T_out − T_in)/ln(T_out/T_in) when it is measured, else T0; for a steam generator and a reheater,
 * whose heat-source temperature the plant description does not give, T_b → ∞, that is the heat is
 * charged as pure exergy, I = T0 Σ m Δs: the exergy lost between a fuel whose exergy is taken
 * equal to the heat it delivers and the steam, an upper bound on the destruction in the furnace and
 * the heat transfer; for a generator, its losses W_shaft − P_el = P_el (1/η − 1), all of which are
 * lost as heat at ambient temperature. Adiabatic components: T0 · S_gen exactly.
 *
 * <h2>Closure</h2>
 * Each independent measurement (generator output / η_gen for the work of its turbine sections,
 * cooling-water duty m_cw (h(p_cw, T_out) − h(p_cw, T_in)) for a condenser's heat, motor power ×
 * η_motor for a pump's work, fuel flow × heating value × boiler efficiency for the heat of the steam
 * generator, and of the unit's reheaters when it has one steam generator, as the boiler efficiency
 * counts reheat absorption) gives one residual, steam side minus independent side, in W:
 * {@code "<turbines>+<generator>"}, {@code "<condenser>+cooling_water"}, {@code "<pump>+motor"},
 * {@code "<steam generator>+fuel"}. A measurement used to fix a state's enthalpy closes
 * identically and is not reported. The {@code "cycle"} residual is heat added − heat rejected − net
 * work with each term from its independent measurement where one is valid, else from the steam
 * side; it is reported when at least one term is independent. Each residual carries u(r) by
 * first-order propagation (GUM, ISO/IEC Guide 98-3, eq. 10, inputs uncorrelated) over every sensor
 * and declared constant it depends on. Sensitivities are exact derivatives of the model
 * (forward-mode, through the linear solve of the flows and the energy-balance states), with
 * (∂h/∂T)_p = cp from IF97 and (∂h/∂p)_T by a forward difference on the IF97 equation of the
 * state's region.
 *
 * <h2>Bad values</h2>
 * {@link #evaluate} never throws for bad sensor values: a sensor that is stale, missing or outside
 * its plausible range, a state impossible for its place in the cycle, a pressure that does not
 * rise across a pump or fall across a turbine, a negative solved flow, or a state outside IF97
 * marks what depends on it invalid with a reason, and everything else is still computed. No NaN
 * reaches the result.
 *
 * <p>A {@code CycleModel} holds scratch arrays for its evaluations and is not thread-safe: use one
 * instance per thread (compiling a second one is cheap).
 */
public final class CycleModel {

    private static final int FIX_PT = 0;
    private static final int FIX_PX = 1;
    private static final int FIX_ENERGY_BALANCE = 2;
    private static final int FIX_ISENTROPIC = 3;
    /** A mixer's outlet, its enthalpy from the adiabatic mixing of the mixer's inlets once the flows are known. */
    private static final int FIX_MIXING = 4;

    private static final int EXPECT_ANY = 0;
    private static final int EXPECT_NOT_LIQUID = 1;
    private static final int EXPECT_LIQUID = 2;

    private static final int C_STEAM_GENERATOR = 0;
    private static final int C_REHEATER = 1;
    private static final int C_TURBINE = 2;
    private static final int C_CONDENSER = 3;
    private static final int C_PUMP = 4;
    private static final int C_OPEN_HEATER = 5;
    private static final int C_CLOSED_HEATER = 6;
    private static final int C_MIXER = 7;
    private static final int C_GENERATOR = 8;

    private static final int G_GENERATOR = 0;
    private static final int G_COOLING_WATER = 1;
    private static final int G_MOTOR = 2;
    private static final int G_FUEL = 3;

    private static final int PHASE_LIQUID = 0;
    private static final int PHASE_TWO = 1;
    private static final int PHASE_VAPOUR = 2;
    private static final int PHASE_SUPER = 3;

    /** Energy-balance rows are written in MJ/kg so that their coefficients are of order one, like the mass rows. */
    private static final double ENERGY_ROW_SCALE = 1e-6;
    /**
     * A pivot below this fraction of the largest coefficient marks the balances as singular at the
     * snapshot's states: with coefficients of order one this is far above rounding (1e-16) and far
     * below any physical conditioning of a heater balance.
     */
    private static final double PIVOT_TOLERANCE = 1e-12;
    /** A solved flow more negative than this fraction of the largest flow is a negative flow, not rounding. */
    private static final double NEGATIVE_FLOW_TOLERANCE = 1e-9;
    /** Below this relative difference two temperatures are taken as equal in a mean temperature. */
    private static final double EQUAL_TEMPERATURE_TOLERANCE = 1e-9;
    /** Seed of the random enthalpies of the structural check, fixed so that compile() is repeatable. */
    private static final long STRUCTURE_SEED = 0x5EED_F10DL;

    private final String siteId;
    private final String unitId;
    private final double deadStateTemperatureK;

    // ---------------------------------------------------------------- inputs
    private final Sensor[] sensors;
    private final int sensorCount;
    private final double[] constantValue;
    private final double[] constantUncertainty;
    private final int inputCount;
    /** The sensors' declared standard uncertainties, SI: what {@link #evaluate(Snapshot)} propagates. */
    private final double[] declaredSensorUncertainty;
    /** The sensors' standard uncertainties of the evaluation under way, SI, for the closure's u(r). */
    private double[] sensorUncertainty;

    // ---------------------------------------------------------------- states
    private final int stateCount;
    private final String[] stateId;
    private final int[] fix;
    private final int[] pressureSensor;
    private final int[] temperatureSensor;
    private final int[] flowSensor;
    private final double[] declaredQuality;
    private final int[] expect;
    private final String[] expectWhere;
    private final int[] balanceGroup;
    /** For a state fixed by mixing, the mixer it leaves; -1 otherwise. */
    private final int[] mixerOf;
    private final int[] isentropicFrom;
    private final int[] isentropicPressureOf;
    private final int[] flowIndex;
    private final int[] flowState;
    private final int flowCount;

    // ---------------------------------------------------------------- components
    private final int componentCount;
    private final String[] componentId;
    private final String[] componentType;
    private final int[] kind;
    private final int[][] inlets;
    private final int[][] outlets;
    private final int[] idealOutlet;
    /** For a generator, its group; for a condenser with cooling water, its group; -1 otherwise. */
    private final int[] componentGroup;

    // ---------------------------------------------------------------- independent measurements
    private final int groupCount;
    private final int[] groupKind;
    private final int[][] groupComponents;
    private final int[] groupFixes;
    private final int[] groupCoefficient;
    private final int[][] groupSensors;
    private final int[][] groupConstants;
    private final double[] groupPressure;
    private final String[] groupClosureId;
    private final String[] groupOwner;
    private final int[] groupSign;

    // ---------------------------------------------------------------- flow system, row r of n = flowCount
    private final int[][] rowStates;
    private final double[][] rowSigns;
    private final boolean[] rowEnergy;
    private final int[] rowSensor;

    // ---------------------------------------------------------------- scratch, reused by every evaluation
    private final double[] value;
    private final boolean[] sensorOk;
    private final double[] pressure;
    private final double[] temperature;
    private final double[] enthalpy;
    private final double[] entropy;
    private final double[] volume;
    private final double[] quality;
    private final boolean[] twoPhase;
    private final int[] phase;
    private final double[] margin;
    private final boolean[] marginKnown;
    private final double[] flow;
    private final boolean[] pressureKnown;
    private final boolean[] propertiesKnown;
    private final boolean[] stateOk;
    private final boolean[] flowKnown;
    private final String[] stateWhy;
    private final String[] flowWhy;
    private final double[][] dEnthalpy;
    private final double[][] dFlow;
    private final double[][] matrix;
    private final int[] permutation;
    private final double[] rhs;
    private final double[] work;
    private final double[][] rhsColumns;
    private final double[][] workRows;
    private final double[] groupValue;
    private final double[][] dGroupValue;
    private final boolean[] groupOk;
    private final String[] groupWhy;
    private final double[] gradient;
    private final double[] gradientPart;
    private final double[] componentHeat;
    private final double[] componentWork;
    private final boolean[] componentOk;
    private final String[] componentWhy;
    private final int[][] singleComponent;
    private final double[] sum1 = new double[1];
    private final String[] why1 = new String[1];
    private Snapshot.SensorStatus[] statusOfSnapshot;
    private final StatePoint point = new StatePoint();

    private CycleModel(String siteId, UnitDescription unit) {
        this.siteId = Objects.requireNonNull(siteId, "siteId");
        this.unitId = unit.id();
        this.deadStateTemperatureK = unit.deadState().temperatureK();
        Problems problems = new Problems();

        sensors = unit.sensors().toArray(new Sensor[0]);
        sensorCount = sensors.length;
        declaredSensorUncertainty = SensorUncertainties.declared(unit.sensors());
        sensorUncertainty = declaredSensorUncertainty;
        Map<String, Integer> sensorIndex = new HashMap<>();
        for (int i = 0; i < sensorCount; i++) {
            if (sensorIndex.putIfAbsent(sensors[i].id(), i) != null) {
                problems.add(Owner.sensor(sensors[i].id()), "sensor \"" + sensors[i].id() + "\" is declared twice");
            }
        }

        List<StateDefinition> states = unit.states();
        stateCount = states.size();
        stateId = new String[stateCount];
        fix = new int[stateCount];
        pressureSensor = filled(stateCount);
        temperatureSensor = filled(stateCount);
        flowSensor = filled(stateCount);
        declaredQuality = new double[stateCount];
        expect = new int[stateCount];
        expectWhere = new String[stateCount];
        balanceGroup = filled(stateCount);
        mixerOf = filled(stateCount);
        isentropicFrom = filled(stateCount);
        isentropicPressureOf = filled(stateCount);
        flowIndex = filled(stateCount);
        Map<String, Integer> stateIndex = new HashMap<>();
        for (int j = 0; j < stateCount; j++) {
            stateId[j] = states.get(j).id();
            if (stateIndex.putIfAbsent(stateId[j], j) != null) {
                problems.add(Owner.state(stateId[j]), "state \"" + stateId[j] + "\" is declared twice");
            }
        }
        int flowing = 0;
        String[] balanceComponentName = new String[stateCount];
        for (int j = 0; j < stateCount; j++) {
            StateDefinition state = states.get(j);
            Owner owner = Owner.state(stateId[j]);
            StateFix f = state.fix();
            if (f instanceof StateFix.MeasuredPressureTemperature pt) {
                fix[j] = FIX_PT;
                pressureSensor[j] = sensor(sensorIndex, pt.pressureSensor(), Quantity.PRESSURE, owner, "pressure", problems);
                temperatureSensor[j] = sensor(sensorIndex, pt.temperatureSensor(), Quantity.TEMPERATURE, owner,
                        "temperature", problems);
            } else if (f instanceof StateFix.SaturatedLiquid sl) {
                fix[j] = FIX_PX;
                declaredQuality[j] = 0.0;
                pressureSensor[j] = sensor(sensorIndex, sl.pressureSensor(), Quantity.PRESSURE, owner, "pressure", problems);
            } else if (f instanceof StateFix.SaturatedVapour sv) {
                fix[j] = FIX_PX;
                declaredQuality[j] = 1.0;
                pressureSensor[j] = sensor(sensorIndex, sv.pressureSensor(), Quantity.PRESSURE, owner, "pressure", problems);
            } else if (f instanceof StateFix.PressureQuality pq) {
                fix[j] = FIX_PX;
                declaredQuality[j] = pq.quality();
                pressureSensor[j] = sensor(sensorIndex, pq.pressureSensor(), Quantity.PRESSURE, owner, "pressure", problems);
            } else if (f instanceof StateFix.EnergyBalance eb) {
                fix[j] = FIX_ENERGY_BALANCE;
                pressureSensor[j] = sensor(sensorIndex, eb.pressureSensor(), Quantity.PRESSURE, owner, "pressure", problems);
                balanceComponentName[j] = eb.componentId();
            } else {
                StateFix.Isentropic is = (StateFix.Isentropic) f;
                fix[j] = FIX_ISENTROPIC;
                isentropicFrom[j] = flowingState(stateIndex, states, is.fromState(), owner, "takes its entropy from", problems);
                isentropicPressureOf[j] = flowingState(stateIndex, states, is.pressureOfState(), owner,
                        "takes its pressure from", problems);
            }
            if (state.isReference()) {
                if (state.flowSensor().isPresent()) {
                    problems.add(owner, owner + " is an ideal reference state, which carries no flow, but has flow sensor \""
                            + state.flowSensor().get() + "\"");
                }
            } else {
                flowIndex[j] = flowing++;
                if (state.flowSensor().isPresent()) {
                    flowSensor[j] = sensor(sensorIndex, state.flowSensor().get(), Quantity.MASS_FLOW, owner, "flow",
                            problems);
                }
            }
        }
        flowCount = flowing;
        flowState = new int[flowCount];
        for (int j = 0; j < stateCount; j++) {
            if (flowIndex[j] >= 0) {
                flowState[flowIndex[j]] = j;
            }
        }

        // ------------------------------------------------------------ components and their ports
        List<Component> components = unit.components();
        componentCount = components.size();
        componentId = new String[componentCount];
        componentType = new String[componentCount];
        kind = new int[componentCount];
        inlets = new int[componentCount][];
        outlets = new int[componentCount][];
        idealOutlet = filled(componentCount);
        componentGroup = filled(componentCount);
        Map<String, Integer> componentIndex = new HashMap<>();
        int[] enters = new int[stateCount];
        int[] leaves = new int[stateCount];
        List<List<String>> enteredBy = new ArrayList<>();
        List<List<String>> leftBy = new ArrayList<>();
        for (int j = 0; j < stateCount; j++) {
            enteredBy.add(new ArrayList<>());
            leftBy.add(new ArrayList<>());
        }
        int steamGenerators = 0;
        for (int c = 0; c < componentCount; c++) {
            Component component = components.get(c);
            componentId[c] = component.id();
            componentType[c] = component.type();
            if (componentIndex.putIfAbsent(component.id(), c) != null) {
                problems.add(Owner.component(component.id()), "component \"" + component.id() + "\" is declared twice");
            }
            kind[c] = kindOf(component);
            if (kind[c] == C_STEAM_GENERATOR) {
                steamGenerators++;
            }
            Owner owner = Owner.component(component.id());
            inlets[c] = ports(component.inlets(), stateIndex, states, owner, problems);
            outlets[c] = ports(component.outlets(), stateIndex, states, owner, problems);
            for (int j : inlets[c]) {
                if (j >= 0) {
                    enters[j]++;
                    enteredBy.get(j).add(component.id());
                }
            }
            for (int j : outlets[c]) {
                if (j >= 0) {
                    leaves[j]++;
                    leftBy.get(j).add(component.id());
                }
            }
            Optional<String> ideal = Optional.empty();
            if (component instanceof Component.TurbineSection t) {
                ideal = t.idealOutlet();
            } else if (component instanceof Component.Pump p) {
                ideal = p.idealOutlet();
            }
            if (ideal.isPresent()) {
                Integer r = stateIndex.get(ideal.get());
                if (r == null) {
                    problems.add(owner, owner + ": ideal outlet \"" + ideal.get() + "\" is not a state of unit \""
                            + unitId + "\"");
                } else if (!states.get(r).isReference()) {
                    problems.add(owner, owner + ": ideal outlet \"" + ideal.get()
                            + "\" must be an isentropic reference state, not a flowing state");
                } else {
                    idealOutlet[c] = r;
                }
            }
        }
        for (int j = 0; j < stateCount; j++) {
            if (flowIndex[j] < 0) {
                continue;
            }
            Owner owner = Owner.state(stateId[j]);
            if (leaves[j] == 0) {
                problems.add(owner, owner
                        + " is the outlet of no component: every flowing state leaves exactly one component");
            } else if (leaves[j] > 1) {
                problems.add(owner, owner + " is the outlet of " + leaves[j] + " components " + leftBy.get(j)
                        + ": every flowing state leaves exactly one component");
            }
            if (enters[j] == 0) {
                problems.add(owner, owner
                        + " is the inlet of no component: every flowing state enters exactly one component");
            } else if (enters[j] > 1) {
                problems.add(owner, owner + " is the inlet of " + enters[j] + " components " + enteredBy.get(j)
                        + ": every flowing state enters exactly one component");
            }
        }
        assignExpectedPhases(components);

        // ------------------------------------------------------------ independent measurements
        List<Integer> gKind = new ArrayList<>();
        List<int[]> gComponents = new ArrayList<>();
        List<int[]> gSensors = new ArrayList<>();
        List<int[]> gConstants = new ArrayList<>();
        List<Double> gPressure = new ArrayList<>();
        List<String> gClosure = new ArrayList<>();
        List<String> gOwner = new ArrayList<>();
        List<Double> constants = new ArrayList<>();
        List<Double> constantU = new ArrayList<>();
        int[] turbineGroup = filled(componentCount);
        int[] pumpGroup = filled(componentCount);
        int[] steamGeneratorGroup = filled(componentCount);
        for (int c = 0; c < componentCount; c++) {
            Component component = components.get(c);
            Owner owner = Owner.component(component.id());
            if (component instanceof Component.Generator gen) {
                List<Integer> shaft = new ArrayList<>();
                StringBuilder closureId = new StringBuilder();
                for (String turbine : gen.turbines()) {
                    Integer t = componentIndex.get(turbine);
                    if (t == null || kind[t] != C_TURBINE) {
                        problems.add(owner, "generator \"" + gen.id() + "\": \"" + turbine
                                + "\" is not a turbine section of unit \"" + unitId + "\"");
                        continue;
                    }
                    if (turbineGroup[t] >= 0) {
                        problems.add(owner, "turbine section \"" + turbine
                                + "\" is on the shaft of more than one generator");
                        continue;
                    }
                    turbineGroup[t] = gKind.size();
                    shaft.add(t);
                    closureId.append(turbine).append('+');
                }
                if (shaft.isEmpty()) {
                    problems.add(owner, "generator \"" + gen.id() + "\" drives no turbine section");
                }
                int power = sensor(sensorIndex, gen.powerSensor(), Quantity.POWER, owner, "power", problems);
                checkFraction(gen.efficiency(), owner, "efficiency", problems);
                componentGroup[c] = gKind.size();
                addGroup(gKind, gComponents, gSensors, gConstants, gPressure, gClosure, gOwner, G_GENERATOR,
                        shaft.stream().mapToInt(Integer::intValue).toArray(), new int[] {power},
                        constantsOf(constants, constantU, gen.efficiency()), 0.0,
                        closureId.append(gen.id()).toString(), gen.id());
            }
        }
        for (int c = 0; c < componentCount; c++) {
            Component component = components.get(c);
            Owner owner = Owner.component(component.id());
            if (component instanceof Component.Condenser cond && cond.coolingWater().isPresent()) {
                CoolingWater cw = cond.coolingWater().get();
                int m = sensor(sensorIndex, cw.flowSensor(), Quantity.MASS_FLOW, owner, "cooling-water flow", problems);
                int tIn = sensor(sensorIndex, cw.inletTemperatureSensor(), Quantity.TEMPERATURE, owner,
                        "cooling-water inlet temperature", problems);
                int tOut = sensor(sensorIndex, cw.outletTemperatureSensor(), Quantity.TEMPERATURE, owner,
                        "cooling-water outlet temperature", problems);
                if (!(cw.pressurePa() > 0.0 && cw.pressurePa() <= Steam.MAX_PRESSURE_PA)) {
                    problems.add(owner, owner + ": cooling-water pressure " + cw.pressurePa()
                            + " Pa is outside 0 Pa to 100 MPa");
                }
                componentGroup[c] = gKind.size();
                addGroup(gKind, gComponents, gSensors, gConstants, gPressure, gClosure, gOwner, G_COOLING_WATER,
                        new int[] {c}, new int[] {m, tIn, tOut}, new int[0], cw.pressurePa(),
                        cond.id() + "+cooling_water", cond.id());
            } else if (component instanceof Component.Pump pump && pump.motor().isPresent()) {
                MotorMeasurement motor = pump.motor().get();
                int power = sensor(sensorIndex, motor.powerSensor(), Quantity.POWER, owner, "motor power", problems);
                checkFraction(motor.efficiency(), owner, "motor efficiency", problems);
                pumpGroup[c] = gKind.size();
                addGroup(gKind, gComponents, gSensors, gConstants, gPressure, gClosure, gOwner, G_MOTOR,
                        new int[] {c}, new int[] {power}, constantsOf(constants, constantU, motor.efficiency()), 0.0,
                        pump.id() + "+motor", pump.id());
            } else if (component instanceof Component.SteamGenerator sg && sg.fuel().isPresent()) {
                FuelMeasurement fuel = sg.fuel().get();
                int m = sensor(sensorIndex, fuel.flowSensor(), Quantity.MASS_FLOW, owner, "fuel flow", problems);
                if (!(fuel.heatingValueJPerKg().value() > 0.0)) {
                    problems.add(owner, owner + ": fuel heating value must be positive, was "
                            + fuel.heatingValueJPerKg().value() + " J/kg");
                }
                checkFraction(fuel.boilerEfficiency(), owner, "boiler efficiency", problems);
                List<Integer> heated = new ArrayList<>();
                heated.add(c);
                if (steamGenerators == 1) {
                    for (int r = 0; r < componentCount; r++) {
                        if (kind[r] == C_REHEATER) {
                            heated.add(r);
                        }
                    }
                }
                int[] both = constantsOf(constants, constantU, fuel.heatingValueJPerKg());
                int[] eta = constantsOf(constants, constantU, fuel.boilerEfficiency());
                steamGeneratorGroup[c] = gKind.size();
                addGroup(gKind, gComponents, gSensors, gConstants, gPressure, gClosure, gOwner, G_FUEL,
                        heated.stream().mapToInt(Integer::intValue).toArray(), new int[] {m},
                        new int[] {both[0], eta[0]}, 0.0, sg.id() + "+fuel", sg.id());
            }
        }
        groupCount = gKind.size();
        groupKind = gKind.stream().mapToInt(Integer::intValue).toArray();
        groupComponents = gComponents.toArray(new int[0][]);
        groupSensors = gSensors.toArray(new int[0][]);
        groupConstants = gConstants.toArray(new int[0][]);
        groupPressure = gPressure.stream().mapToDouble(Double::doubleValue).toArray();
        groupClosureId = gClosure.toArray(new String[0]);
        groupOwner = gOwner.toArray(new String[0]);
        groupFixes = filled(groupCount);
        groupCoefficient = new int[groupCount];
        groupSign = new int[groupCount];
        for (int g = 0; g < groupCount; g++) {
            // r = steam side − independent side; the steam side S = Σ m_out h_out − Σ m_in h_in is −W
            // for turbines and −|Q| for a condenser, so those two change sign.
            groupSign[g] = groupKind[g] == G_GENERATOR || groupKind[g] == G_COOLING_WATER ? -1 : 1;
        }
        constantValue = constants.stream().mapToDouble(Double::doubleValue).toArray();
        constantUncertainty = constantU.stream().mapToDouble(Double::doubleValue).toArray();
        inputCount = sensorCount + constantValue.length;

        // ------------------------------------------------------------ states fixed by an energy balance
        for (int j = 0; j < stateCount; j++) {
            if (fix[j] != FIX_ENERGY_BALANCE) {
                continue;
            }
            String name = balanceComponentName[j];
            Owner state = Owner.state(stateId[j]);
            String owner = "state \"" + stateId[j] + "\" is fixed by the energy balance of \"" + name + "\"";
            Integer c = componentIndex.get(name);
            if (c == null) {
                problems.add(state, owner + ", which is not a component of unit \"" + unitId + "\"");
                continue;
            }
            if (kind[c] == C_MIXER) {
                if (outlets[c][0] != j) {
                    problems.add(state, owner + ", but only the outlet of a mixer takes its enthalpy from the"
                            + " adiabatic mixing of the mixer's inlets");
                    continue;
                }
                fix[j] = FIX_MIXING;
                mixerOf[j] = c;
                continue;
            }
            int g = switch (kind[c]) {
                case C_CONDENSER, C_GENERATOR -> componentGroup[c];
                case C_TURBINE -> turbineGroup[c];
                case C_PUMP -> pumpGroup[c];
                case C_STEAM_GENERATOR -> steamGeneratorGroup[c];
                default -> -1;
            };
            if (g < 0) {
                problems.add(state, owner + ", which has no independent measurement");
                continue;
            }
            if (groupFixes[g] >= 0) {
                problems.add(state, "the energy balance of \"" + groupOwner[g] + "\" is asked to fix both state \""
                        + stateId[groupFixes[g]] + "\" and state \"" + stateId[j] + "\"; one balance fixes one state");
                continue;
            }
            int coefficient = 0;
            for (int comp : groupComponents[g]) {
                coefficient += count(outlets[comp], j) - count(inlets[comp], j);
            }
            if (coefficient == 0) {
                problems.add(state, owner + ", but it is not a port of "
                        + (groupKind[g] == G_GENERATOR ? "the turbine sections on that shaft" : "that component"));
                continue;
            }
            groupFixes[g] = j;
            groupCoefficient[g] = coefficient;
            balanceGroup[j] = g;
        }
        for (int g = 0; g < groupCount; g++) {
            if (groupFixes[g] < 0) {
                continue;
            }
            for (int comp : groupComponents[g]) {
                for (int[] ports : new int[][] {inlets[comp], outlets[comp]}) {
                    for (int j : ports) {
                        if (j >= 0 && j != groupFixes[g] && fix[j] == FIX_ENERGY_BALANCE) {
                            problems.add(Owner.state(stateId[groupFixes[g]]), "state \"" + stateId[groupFixes[g]]
                                    + "\" is fixed by the energy balance of \""
                                    + groupOwner[g] + "\", which needs state \"" + stateId[j]
                                    + "\", itself fixed by an energy balance");
                        }
                    }
                }
            }
        }

        for (int j = 0; j < stateCount; j++) {
            if (fix[j] != FIX_MIXING) {
                continue;
            }
            for (int in : inlets[mixerOf[j]]) {
                if (in >= 0 && (fix[in] == FIX_ENERGY_BALANCE || fix[in] == FIX_MIXING)) {
                    problems.add(Owner.state(stateId[j]), "state \"" + stateId[j]
                            + "\" takes its enthalpy from the mixing in \""
                            + componentId[mixerOf[j]] + "\", whose inlet \"" + stateId[in] + "\" is itself fixed by "
                            + (fix[in] == FIX_MIXING ? "mixing" : "an energy balance")
                            + "; measure that inlet or the mixer's outlet instead");
                }
            }
        }

        // ------------------------------------------------------------ the flow system
        List<int[]> rStates = new ArrayList<>();
        List<double[]> rSigns = new ArrayList<>();
        List<Boolean> rEnergy = new ArrayList<>();
        List<Integer> rSensor = new ArrayList<>();
        List<String> rLabel = new ArrayList<>();
        if (problems.isEmpty()) {
            buildRows(components, rStates, rSigns, rEnergy, rSensor, rLabel, problems);
        }
        if (problems.isEmpty()) {
            int[] chosen = chooseIndependentRows(rStates, rSigns, rEnergy, rSensor, rLabel, problems);
            rowStates = new int[chosen.length][];
            rowSigns = new double[chosen.length][];
            rowEnergy = new boolean[chosen.length];
            rowSensor = new int[chosen.length];
            for (int r = 0; r < chosen.length; r++) {
                rowStates[r] = rStates.get(chosen[r]);
                rowSigns[r] = rSigns.get(chosen[r]);
                rowEnergy[r] = rEnergy.get(chosen[r]);
                rowSensor[r] = rSensor.get(chosen[r]);
            }
        } else {
            rowStates = new int[0][];
            rowSigns = new double[0][];
            rowEnergy = new boolean[0];
            rowSensor = new int[0];
        }
        if (!problems.isEmpty()) {
            throw CycleModelException.located(unitId, problems.list);
        }

        // ------------------------------------------------------------ scratch
        value = new double[sensorCount];
        sensorOk = new boolean[sensorCount];
        pressure = new double[stateCount];
        temperature = new double[stateCount];
        enthalpy = new double[stateCount];
        entropy = new double[stateCount];
        volume = new double[stateCount];
        quality = new double[stateCount];
        twoPhase = new boolean[stateCount];
        phase = new int[stateCount];
        margin = new double[stateCount];
        marginKnown = new boolean[stateCount];
        flow = new double[stateCount];
        pressureKnown = new boolean[stateCount];
        propertiesKnown = new boolean[stateCount];
        stateOk = new boolean[stateCount];
        flowKnown = new boolean[stateCount];
        stateWhy = new String[stateCount];
        flowWhy = new String[stateCount];
        dEnthalpy = new double[stateCount][inputCount];
        dFlow = new double[stateCount][inputCount];
        matrix = new double[flowCount][flowCount];
        permutation = new int[flowCount];
        rhs = new double[flowCount];
        work = new double[flowCount];
        rhsColumns = new double[flowCount][inputCount];
        workRows = new double[flowCount][];
        groupValue = new double[groupCount];
        dGroupValue = new double[groupCount][inputCount];
        groupOk = new boolean[groupCount];
        groupWhy = new String[groupCount];
        gradient = new double[inputCount];
        gradientPart = new double[inputCount];
        componentHeat = new double[componentCount];
        componentWork = new double[componentCount];
        componentOk = new boolean[componentCount];
        componentWhy = new String[componentCount];
        singleComponent = new int[componentCount][];
        for (int c = 0; c < componentCount; c++) {
            singleComponent[c] = new int[] {c};
        }
    }

    /**
     * Checks a unit description and prepares its model: resolves every reference between states,
     * sensors and components, infers each state's expected phase, and checks that the mass and
     * energy balances fix every flow exactly once.
     *
     * @param siteId the site the unit belongs to, carried into every result
     * @param unit   the unit, as built by the plant-description loader
     * @return the compiled model, ready for {@link #evaluate}
     * @throws CycleModelException listing every problem found, each naming the element concerned
     */
    public static CycleModel compile(String siteId, UnitDescription unit) {
        Objects.requireNonNull(unit, "unit");
        return new CycleModel(siteId, unit);
    }

    /** The site id carried into the results. */
    public String siteId() {
        return siteId;
    }

    /** The unit id the snapshots must carry. */
    public String unitId() {
        return unitId;
    }

    // ================================================================ compile helpers

    /** The element a compile problem is about; its text is how messages name it. */
    private record Owner(CycleModelException.Element element, String id) {
        static Owner unit(String id) {
            return new Owner(CycleModelException.Element.UNIT, id);
        }

        static Owner sensor(String id) {
            return new Owner(CycleModelException.Element.SENSOR, id);
        }

        static Owner state(String id) {
            return new Owner(CycleModelException.Element.STATE, id);
        }

        static Owner component(String id) {
            return new Owner(CycleModelException.Element.COMPONENT, id);
        }

        @Override
        public String toString() {
            return switch (element) {
                case UNIT -> "unit \"" + id + "\"";
                case SENSOR -> "sensor \"" + id + "\"";
                case STATE -> "state \"" + id + "\"";
                case COMPONENT -> "component \"" + id + "\"";
            };
        }
    }

    /** Compile problems, each with the element it is about. */
    private static final class Problems {
        final List<CycleModelException.Problem> list = new ArrayList<>();

        void add(Owner owner, String message) {
            list.add(new CycleModelException.Problem(owner.element(), owner.id(), message));
        }

        boolean isEmpty() {
            return list.isEmpty();
        }

        boolean anyContains(String text) {
            return list.stream().anyMatch(p -> p.message().contains(text));
        }
    }

    /** The component id in a row label {@code energy balance of "id"}. */
    private static String componentOfRow(String label) {
        int open = label.indexOf('"');
        return label.substring(open + 1, label.lastIndexOf('"'));
    }

    private static int[] filled(int n) {
        int[] a = new int[n];
        Arrays.fill(a, -1);
        return a;
    }

    private static int count(int[] ports, int j) {
        int n = 0;
        for (int port : ports) {
            if (port == j) {
                n++;
            }
        }
        return n;
    }

    private int sensor(Map<String, Integer> index, String id, Quantity quantity, Owner owner, String role,
                       Problems problems) {
        Integer i = index.get(id);
        if (i == null) {
            problems.add(owner, owner + ": " + role + " sensor \"" + id + "\" is not a sensor of unit \"" + unitId + "\"");
            return -1;
        }
        if (sensors[i].quantity() != quantity) {
            problems.add(owner, owner + ": " + role + " sensor \"" + id + "\" measures " + sensors[i].quantity()
                    + ", not " + quantity);
            return -1;
        }
        return i;
    }

    private int flowingState(Map<String, Integer> index, List<StateDefinition> states, String id, Owner owner,
                             String role, Problems problems) {
        Integer j = index.get(id);
        if (j == null) {
            problems.add(owner, owner + " " + role + " \"" + id + "\", which is not a state of unit \"" + unitId + "\"");
            return -1;
        }
        if (states.get(j).isReference()) {
            problems.add(owner, owner + " " + role + " \"" + id + "\", which is itself an ideal reference state");
            return -1;
        }
        return j;
    }

    private int[] ports(List<String> ids, Map<String, Integer> index, List<StateDefinition> states, Owner owner,
                        Problems problems) {
        int[] result = new int[ids.size()];
        for (int k = 0; k < result.length; k++) {
            Integer j = index.get(ids.get(k));
            if (j == null) {
                problems.add(owner, owner + ": port \"" + ids.get(k) + "\" is not a state of unit \"" + unitId + "\"");
                result[k] = -1;
            } else if (states.get(j).isReference()) {
                problems.add(owner, owner + ": port \"" + ids.get(k)
                        + "\" is an ideal reference state, which carries no flow and sits on no port");
                result[k] = -1;
            } else {
                result[k] = j;
            }
        }
        return result;
    }

    private static int kindOf(Component component) {
        if (component instanceof Component.SteamGenerator) {
            return C_STEAM_GENERATOR;
        } else if (component instanceof Component.Reheater) {
            return C_REHEATER;
        } else if (component instanceof Component.TurbineSection) {
            return C_TURBINE;
        } else if (component instanceof Component.Condenser) {
            return C_CONDENSER;
        } else if (component instanceof Component.Pump) {
            return C_PUMP;
        } else if (component instanceof Component.OpenFeedwaterHeater) {
            return C_OPEN_HEATER;
        } else if (component instanceof Component.ClosedFeedwaterHeater) {
            return C_CLOSED_HEATER;
        } else if (component instanceof Component.Mixer) {
            return C_MIXER;
        }
        return C_GENERATOR;
    }

    private static void checkFraction(UncertainConstant c, Owner owner, String what, Problems problems) {
        if (!(c.value() > 0.0 && c.value() <= 1.0)) {
            problems.add(owner, owner + ": " + what + " must lie within 0 (exclusive) and 1, was " + c.value());
        }
    }

    private static int[] constantsOf(List<Double> values, List<Double> uncertainties, UncertainConstant c) {
        values.add(c.value());
        uncertainties.add(c.standardUncertainty());
        return new int[] {values.size() - 1};
    }

    private static void addGroup(List<Integer> kinds, List<int[]> comps, List<int[]> sensorLists, List<int[]> consts,
                                 List<Double> pressures, List<String> closures, List<String> owners, int kind,
                                 int[] components, int[] sensorIds, int[] constantIds, double pressure,
                                 String closureId, String owner) {
        kinds.add(kind);
        comps.add(components);
        sensorLists.add(sensorIds);
        consts.add(constantIds);
        pressures.add(pressure);
        closures.add(closureId);
        owners.add(owner);
    }

    private void assignExpectedPhases(List<Component> components) {
        for (int c = 0; c < componentCount; c++) {
            Component component = components.get(c);
            String id = component.id();
            if (component instanceof Component.TurbineSection t) {
                expectPhase(inlets[c][0], EXPECT_NOT_LIQUID, "inlet of turbine section \"" + id + "\"");
                for (int k = 0; k < outlets[c].length; k++) {
                    boolean last = k == outlets[c].length - 1;
                    expectPhase(outlets[c][k], EXPECT_NOT_LIQUID,
                            (last ? "outlet" : "extraction") + " of turbine section \"" + id + "\"");
                }
            } else if (component instanceof Component.SteamGenerator) {
                expectPhase(inlets[c][0], EXPECT_LIQUID, "feedwater inlet of steam generator \"" + id + "\"");
                expectPhase(outlets[c][0], EXPECT_NOT_LIQUID, "outlet of steam generator \"" + id + "\"");
            } else if (component instanceof Component.Reheater) {
                expectPhase(inlets[c][0], EXPECT_NOT_LIQUID, "inlet of reheater \"" + id + "\"");
                expectPhase(outlets[c][0], EXPECT_NOT_LIQUID, "outlet of reheater \"" + id + "\"");
            } else if (component instanceof Component.Pump) {
                expectPhase(inlets[c][0], EXPECT_LIQUID, "inlet of pump \"" + id + "\"");
                expectPhase(outlets[c][0], EXPECT_LIQUID, "outlet of pump \"" + id + "\"");
            } else if (component instanceof Component.Condenser) {
                expectPhase(outlets[c][0], EXPECT_LIQUID, "outlet of condenser \"" + id + "\"");
            } else if (component instanceof Component.ClosedFeedwaterHeater) {
                // inlets: feedwater, steam, drains...; outlets: feedwater, drain
                expectPhase(inlets[c][0], EXPECT_LIQUID, "feedwater inlet of closed heater \"" + id + "\"");
                expectPhase(inlets[c][1], EXPECT_NOT_LIQUID, "steam inlet of closed heater \"" + id + "\"");
                expectPhase(outlets[c][0], EXPECT_LIQUID, "feedwater outlet of closed heater \"" + id + "\"");
            }
        }
    }

    private void expectPhase(int j, int expectation, String where) {
        if (j < 0) {
            return;
        }
        if (expect[j] == EXPECT_ANY && expectWhere[j] == null) {
            expect[j] = expectation;
            expectWhere[j] = where;
        } else if (expect[j] != expectation) {
            // Contradictory places (a mis-drawn cycle the validator let through): no phase check.
            expect[j] = EXPECT_ANY;
        }
    }

    private void buildRows(List<Component> components, List<int[]> states, List<double[]> signs,
                           List<Boolean> energy, List<Integer> sensorRows, List<String> labels, Problems problems) {
        for (int c = 0; c < componentCount; c++) {
            if (kind[c] == C_GENERATOR) {
                continue;
            }
            if (kind[c] == C_CLOSED_HEATER) {
                Component.ClosedFeedwaterHeater h = (Component.ClosedFeedwaterHeater) components.get(c);
                addRow(states, signs, energy, sensorRows, labels, new int[] {inlets[c][0], outlets[c][0]},
                        new double[] {1, -1}, false, -1, "feedwater mass balance of \"" + h.id() + "\"");
                int[] shell = new int[inlets[c].length];
                double[] shellSigns = new double[shell.length];
                for (int k = 1; k < inlets[c].length; k++) {
                    shell[k - 1] = inlets[c][k];
                    shellSigns[k - 1] = 1;
                }
                shell[shell.length - 1] = outlets[c][1];
                shellSigns[shell.length - 1] = -1;
                addRow(states, signs, energy, sensorRows, labels, shell, shellSigns, false, -1,
                        "shell mass balance of \"" + h.id() + "\"");
            } else {
                addRow(states, signs, energy, sensorRows, labels, concat(inlets[c], outlets[c]),
                        signs(inlets[c].length, outlets[c].length), false, -1, "mass balance of \"" + componentId[c] + "\"");
            }
            boolean mixingFixesOutlet = kind[c] == C_MIXER && fix[outlets[c][0]] == FIX_MIXING;
            if (kind[c] == C_OPEN_HEATER || kind[c] == C_MIXER && !mixingFixesOutlet || kind[c] == C_CLOSED_HEATER) {
                int[] all = concat(inlets[c], outlets[c]);
                double[] allSigns = signs(inlets[c].length, outlets[c].length);
                // A mixing outlet's m h is the sum of its mixer's inlets' m h: the same balance, linear in the flows.
                int mixing = 0;
                for (int j : all) {
                    mixing += fix[j] == FIX_MIXING ? 1 : 0;
                }
                if (mixing > 0) {
                    List<Integer> expanded = new ArrayList<>();
                    List<Double> expandedSigns = new ArrayList<>();
                    for (int k = 0; k < all.length; k++) {
                        if (fix[all[k]] == FIX_MIXING) {
                            for (int in : inlets[mixerOf[all[k]]]) {
                                expanded.add(in);
                                expandedSigns.add(allSigns[k]);
                            }
                        } else {
                            expanded.add(all[k]);
                            expandedSigns.add(allSigns[k]);
                        }
                    }
                    all = expanded.stream().mapToInt(Integer::intValue).toArray();
                    allSigns = expandedSigns.stream().mapToDouble(Double::doubleValue).toArray();
                }
                for (int j : all) {
                    if (fix[j] == FIX_ENERGY_BALANCE) {
                        problems.add(Owner.state(stateId[j]), "state \"" + stateId[j]
                                + "\" takes its enthalpy from the energy balance of \""
                                + groupOwner[balanceGroup[j]]
                                + "\" after the flows are solved, so it cannot enter the energy balance of \""
                                + componentId[c] + "\", which the flows are solved from");
                    }
                }
                addRow(states, signs, energy, sensorRows, labels, all, allSigns,
                        true, -1, "energy balance of \"" + componentId[c] + "\"");
            }
        }
        for (int j = 0; j < stateCount; j++) {
            if (flowSensor[j] >= 0) {
                addRow(states, signs, energy, sensorRows, labels, new int[] {j}, new double[] {1}, false, flowSensor[j],
                        "flow sensor \"" + sensors[flowSensor[j]].id() + "\" on state \"" + stateId[j] + "\"");
            }
        }
    }

    private static void addRow(List<int[]> states, List<double[]> signs, List<Boolean> energy, List<Integer> sensorRows,
                               List<String> labels, int[] rowStates, double[] rowSigns, boolean isEnergy, int sensor,
                               String label) {
        states.add(rowStates);
        signs.add(rowSigns);
        energy.add(isEnergy);
        sensorRows.add(sensor);
        labels.add(label);
    }

    private static int[] concat(int[] a, int[] b) {
        int[] r = Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, r, a.length, b.length);
        return r;
    }

    private static double[] signs(int in, int out) {
        double[] r = new double[in + out];
        Arrays.fill(r, 0, in, 1.0);
        Arrays.fill(r, in, in + out, -1.0);
        return r;
    }

    /**
     * Picks a maximal independent set of rows, in the order mass balances, energy balances, flow
     * sensors, with random enthalpies in the energy rows: at random coefficients a system has its
     * structural (generic) rank with probability one. A dependent mass balance is the one each closed
     * loop implies; a dependent energy balance or flow sensor over-determines the flows.
     */
    private int[] chooseIndependentRows(List<int[]> states, List<double[]> signs, List<Boolean> energy,
                                        List<Integer> sensorRows, List<String> labels, Problems problems) {
        SplittableRandom random = new SplittableRandom(STRUCTURE_SEED);
        double[] h = new double[stateCount];
        for (int j = 0; j < stateCount; j++) {
            h[j] = random.nextDouble(0.1, 3.5);
        }
        DenseLinearSolver.EchelonBasis basis = new DenseLinearSolver.EchelonBasis(flowCount);
        List<Integer> chosen = new ArrayList<>();
        int[] order = new int[states.size()];
        int n = 0;
        for (int pass = 0; pass < 3; pass++) {
            for (int r = 0; r < states.size(); r++) {
                int rowPass = sensorRows.get(r) >= 0 ? 2 : energy.get(r) ? 1 : 0;
                if (rowPass == pass) {
                    order[n++] = r;
                }
            }
        }
        List<String> energyLabels = new ArrayList<>();
        for (int r = 0; r < states.size(); r++) {
            if (energy.get(r)) {
                energyLabels.add(labels.get(r).substring("energy balance of ".length()));
            }
        }
        boolean balancesAloneFixEverything = false;
        boolean firstSensorRow = true;
        // The energy balance that completed the rank, where a surplus among them is best shown.
        String lastEnergyLabel = null;
        for (int r : order) {
            if (sensorRows.get(r) >= 0 && firstSensorRow) {
                firstSensorRow = false;
                balancesAloneFixEverything = basis.rank() == flowCount;
            }
            if (balancesAloneFixEverything && sensorRows.get(r) >= 0 && !problems.anyContains(
                    "the mass and energy balances alone leave no flow free")) {
                // The homogeneous balances have only the zero solution: the surplus is an energy
                // balance, not the flow sensor that happens to come after it.
                Owner surplus = lastEnergyLabel == null ? Owner.unit(unitId)
                        : Owner.component(componentOfRow(lastEnergyLabel));
                problems.add(surplus, "flows are over-determined: the mass and energy balances alone"
                        + " leave no flow free"
                        + " (they would force every flow to zero), so one of the energy balances of "
                        + energyLabels + " is redundant, for example a mixer or heater all of whose flows the"
                        + " other balances already fix; a mixer's outlet can instead take its enthalpy from the"
                        + " mixer's own energy balance, unmeasured");
            }
            double[] row = new double[flowCount];
            int[] js = states.get(r);
            for (int k = 0; k < js.length; k++) {
                row[flowIndex[js[k]]] += signs.get(r)[k] * (energy.get(r) ? h[js[k]] : 1.0);
            }
            if (basis.add(row)) {
                chosen.add(r);
                if (energy.get(r)) {
                    lastEnergyLabel = labels.get(r);
                }
            } else if (sensorRows.get(r) >= 0 && !balancesAloneFixEverything) {
                problems.add(Owner.state(stateId[states.get(r)[0]]), "flows are over-determined: " + labels.get(r)
                        + " measures a flow that the balances and the flow sensors before it already fix; redundant"
                        + " flow measurements are not reconciled, so declare only one of them as a state's flow sensor");
            } else if (energy.get(r)) {
                problems.add(Owner.component(componentOfRow(labels.get(r))), "flows are over-determined: the " + labels.get(r)
                        + " adds nothing to the mass balances and the other energy balances");
            }
        }
        if (basis.rank() < flowCount) {
            List<String> loose = new ArrayList<>();
            for (int u = 0; u < flowCount; u++) {
                double[] unitRow = new double[flowCount];
                unitRow[u] = 1.0;
                if (!basis.spans(unitRow)) {
                    loose.add(stateId[flowState[u]]);
                }
            }
            boolean anyFlowSensor = false;
            for (int j = 0; j < stateCount; j++) {
                anyFlowSensor |= flowSensor[j] >= 0;
            }
            problems.add(Owner.state(loose.get(0)), "mass balance cannot close: the flows of states " + loose
                    + " are not fixed by any measured flow or balance"
                    + (anyFlowSensor ? "" : " (no state of the unit has a flow sensor)"));
        }
        return chosen.stream().mapToInt(Integer::intValue).toArray();
    }

    // ================================================================ evaluation

    /**
     * Evaluates one snapshot. Never throws for bad sensor values: see the class comment.
     *
     * @param snapshot one value and status per sensor of the unit, in declaration order
     * @return the unit's result record for the snapshot's instant
     * @throws IllegalArgumentException if the snapshot is for another unit or has a different
     *                                  number of sensors (a wiring error, not a bad value)
     */
    public UnitResult evaluate(Snapshot snapshot) {
        return evaluateWith(snapshot, declaredSensorUncertainty);
    }

    /**
     * Evaluates one snapshot as {@link #evaluate(Snapshot)} does, with the closure uncertainties
     * u(r) propagated from the given sensor uncertainties instead of the declared ones (e.g. those
     * of a mean of n readings, u/√n): the same record as a model compiled from the unit with these
     * uncertainties would give, without compiling one. The declared constants keep theirs.
     *
     * @param standardUncertaintySi one standard uncertainty per sensor, SI, in declaration order,
     *                              each positive and finite (see {@link SensorUncertainties})
     * @throws IllegalArgumentException as {@link #evaluate(Snapshot)}, and when the uncertainties are
     *                                  not one positive finite value per sensor
     */
    public UnitResult evaluate(Snapshot snapshot, double[] standardUncertaintySi) {
        return evaluateWith(snapshot, SensorUncertainties.checked(unitId, sensors, standardUncertaintySi));
    }

    private UnitResult evaluateWith(Snapshot snapshot, double[] standardUncertaintySi) {
        sensorUncertainty = standardUncertaintySi;
        if (!snapshot.unitId().equals(unitId)) {
            throw new IllegalArgumentException("snapshot of unit \"" + snapshot.unitId() + "\" given to the model of unit \""
                    + unitId + "\"");
        }
        if (snapshot.valuesSi().length != sensorCount) {
            throw new IllegalArgumentException("snapshot of unit \"" + unitId + "\" has " + snapshot.valuesSi().length
                    + " values; the unit has " + sensorCount + " sensors");
        }
        readSensors(snapshot);
        fixDirectStates();
        checkPressureChanges();
        checkDirectPhases();
        solveFlows();
        fixMixingStates();
        evaluateGroups();
        fixBalanceStates();
        fixReferenceStates();
        evaluateComponents();
        return new UnitResult(snapshot.timestamp(), siteId, unitId, stateResults(), componentResults(), cycleResult(),
                closureResults());
    }

    private void readSensors(Snapshot snapshot) {
        double[] values = snapshot.valuesSi();
        Snapshot.SensorStatus[] status = snapshot.status();
        statusOfSnapshot = status;
        for (int i = 0; i < sensorCount; i++) {
            double v = values[i];
            value[i] = v;
            sensorOk[i] = status[i] == Snapshot.SensorStatus.GOOD && Double.isFinite(v) && sensors[i].isPlausible(v);
        }
    }

    private String sensorWhy(int i) {
        Sensor sensor = sensors[i];
        Snapshot.SensorStatus status = statusOfSnapshot[i];
        if (status == Snapshot.SensorStatus.STALE) {
            return "sensor \"" + sensor.id() + "\" is stale";
        }
        if (status == Snapshot.SensorStatus.MISSING) {
            return "sensor \"" + sensor.id() + "\" has no value";
        }
        return "sensor \"" + sensor.id() + "\" reads " + value[i] + " " + sensor.quantity().siUnit()
                + ", outside its plausible range " + sensor.rangeMinSi() + " to " + sensor.rangeMaxSi() + " "
                + sensor.quantity().siUnit();
    }

    private void fixDirectStates() {
        for (int j = 0; j < stateCount; j++) {
            pressureKnown[j] = false;
            propertiesKnown[j] = false;
            stateOk[j] = false;
            flowKnown[j] = false;
            marginKnown[j] = false;
            stateWhy[j] = null;
            flowWhy[j] = null;
            Arrays.fill(dEnthalpy[j], 0.0);
            Arrays.fill(dFlow[j], 0.0);
            int ps = pressureSensor[j];
            if (ps >= 0) {
                if (sensorOk[ps]) {
                    pressure[j] = value[ps];
                    pressureKnown[j] = true;
                } else {
                    stateWhy[j] = sensorWhy(ps);
                }
            }
            if (fix[j] == FIX_PT) {
                int ts = temperatureSensor[j];
                if (!sensorOk[ts]) {
                    if (stateWhy[j] == null) {
                        stateWhy[j] = sensorWhy(ts);
                    }
                    continue;
                }
                temperature[j] = value[ts];
                if (!pressureKnown[j]) {
                    continue;
                }
                try {
                    point.setPT(pressure[j], temperature[j]);
                } catch (SteamRangeException | IllegalStateException e) {
                    stateWhy[j] = "no IF97 state: " + e.getMessage();
                    continue;
                }
                takePoint(j);
                dEnthalpy[j][ps] = point.dhdp;
                dEnthalpy[j][ts] = point.dhdT;
            } else if (fix[j] == FIX_PX) {
                if (!pressureKnown[j]) {
                    continue;
                }
                try {
                    point.setPX(pressure[j], declaredQuality[j]);
                } catch (SteamRangeException | IllegalStateException e) {
                    stateWhy[j] = "no saturated state: " + e.getMessage();
                    continue;
                }
                takePoint(j);
                dEnthalpy[j][ps] = point.dhdp;
            }
        }
    }

    /** Copies the point into state j's slots, with its phase and saturation margin. */
    private void takePoint(int j) {
        pressure[j] = point.p;
        temperature[j] = point.T;
        enthalpy[j] = point.h;
        entropy[j] = point.s;
        volume[j] = point.v;
        quality[j] = point.x;
        twoPhase[j] = point.twoPhase;
        propertiesKnown[j] = true;
        stateOk[j] = stateWhy[j] == null;
        if (point.twoPhase) {
            phase[j] = PHASE_TWO;
            margin[j] = 0.0;
            marginKnown[j] = true;
        } else if (point.p >= If97Constants.CRITICAL_PRESSURE_PA) {
            phase[j] = point.T >= If97Constants.CRITICAL_TEMPERATURE_K ? PHASE_SUPER : PHASE_LIQUID;
        } else if (point.p < Steam.TRIPLE_POINT_PRESSURE_PA) {
            phase[j] = PHASE_VAPOUR;
        } else {
            double ts = Steam.saturationTemperature(point.p);
            if (point.T > ts) {
                phase[j] = PHASE_VAPOUR;
                margin[j] = point.T - ts;
            } else {
                phase[j] = PHASE_LIQUID;
                margin[j] = ts - point.T;
            }
            marginKnown[j] = true;
        }
    }

    private void checkExpectedPhase(int j, String how) {
        if (!stateOk[j]) {
            return;
        }
        if (expect[j] == EXPECT_NOT_LIQUID && phase[j] == PHASE_LIQUID && marginKnown[j] && margin[j] > 0.0) {
            invalidate(j, "as " + expectWhere[j] + " it must be vapour or wet steam, but the " + how
                    + " state is liquid, " + margin[j] + " K below saturation at " + pressure[j] + " Pa");
        } else if (expect[j] == EXPECT_LIQUID
                && (phase[j] == PHASE_VAPOUR || phase[j] == PHASE_TWO && quality[j] > 0.0)) {
            invalidate(j, "as " + expectWhere[j] + " it must be liquid, but the " + how + " state is "
                    + (phase[j] == PHASE_VAPOUR ? "vapour, " + margin[j] + " K above saturation"
                    : "wet, quality " + quality[j]) + " at " + pressure[j] + " Pa");
        }
    }

    /** After the pressure checks, whose reasons are the more specific when both apply. */
    private void checkDirectPhases() {
        for (int j = 0; j < stateCount; j++) {
            if (fix[j] == FIX_PT) {
                checkExpectedPhase(j, "measured");
            } else if (fix[j] == FIX_PX) {
                checkExpectedPhase(j, "declared");
            }
        }
    }

    private void invalidate(int j, String why) {
        stateOk[j] = false;
        if (stateWhy[j] == null) {
            stateWhy[j] = why;
        }
    }

    private void checkPressureChanges() {
        for (int c = 0; c < componentCount; c++) {
            if (kind[c] == C_PUMP) {
                int in = inlets[c][0];
                int out = outlets[c][0];
                if (pressureKnown[in] && pressureKnown[out] && !(pressure[out] > pressure[in])) {
                    invalidate(out, "pressure does not rise across pump \"" + componentId[c] + "\": inlet "
                            + pressure[in] + " Pa, outlet " + pressure[out] + " Pa");
                }
            } else if (kind[c] == C_TURBINE) {
                int in = inlets[c][0];
                for (int out : outlets[c]) {
                    if (pressureKnown[in] && pressureKnown[out] && !(pressure[out] < pressure[in])) {
                        invalidate(out, "pressure does not fall across turbine section \"" + componentId[c]
                                + "\": inlet " + pressure[in] + " Pa, this port " + pressure[out] + " Pa");
                    }
                }
            }
        }
    }

    private void solveFlows() {
        int n = flowCount;
        String why = null;
        for (int r = 0; r < n && why == null; r++) {
            if (rowSensor[r] >= 0 && !sensorOk[rowSensor[r]]) {
                why = "flow unknown: " + sensorWhy(rowSensor[r]);
            } else if (rowEnergy[r]) {
                for (int j : rowStates[r]) {
                    if (!stateOk[j]) {
                        why = "flow unknown: the balances need state \"" + stateId[j] + "\", which is invalid";
                        break;
                    }
                }
            }
        }
        if (why == null) {
            for (int r = 0; r < n; r++) {
                Arrays.fill(matrix[r], 0.0);
                double[] row = matrix[r];
                int[] js = rowStates[r];
                double[] sg = rowSigns[r];
                for (int k = 0; k < js.length; k++) {
                    int j = js[k];
                    row[flowIndex[j]] += rowEnergy[r] ? sg[k] * enthalpy[j] * ENERGY_ROW_SCALE : sg[k];
                }
                rhs[r] = rowSensor[r] >= 0 ? value[rowSensor[r]] : 0.0;
            }
            if (!DenseLinearSolver.factor(matrix, n, permutation, PIVOT_TOLERANCE)) {
                why = "flow unknown: the heater balances are singular at these states";
            }
        }
        if (why != null) {
            for (int j = 0; j < stateCount; j++) {
                if (flowIndex[j] < 0) {
                    continue;
                }
                int fs = flowSensor[j];
                if (fs >= 0 && sensorOk[fs]) {
                    flow[j] = value[fs];
                    flowKnown[j] = true;
                    dFlow[j][fs] = 1.0;
                } else {
                    flowWhy[j] = fs >= 0 ? "flow unknown: " + sensorWhy(fs) : why;
                }
            }
            return;
        }
        DenseLinearSolver.solve(matrix, n, permutation, rhs, work);
        double largest = 0.0;
        for (int u = 0; u < n; u++) {
            largest = Math.max(largest, Math.abs(rhs[u]));
        }
        for (int u = 0; u < n; u++) {
            int j = flowState[u];
            flow[j] = rhs[u];
            if (rhs[u] < -NEGATIVE_FLOW_TOLERANCE * largest) {
                flowWhy[j] = "the balances give a negative flow, " + rhs[u] + " kg/s: the measured states do not fit"
                        + " together";
            } else {
                flowKnown[j] = true;
            }
        }
        // d m / d x from A dm = db − (dA) m: only the measured rows have db, only the energy rows dA.
        for (int r = 0; r < n; r++) {
            double[] target = rhsColumns[r];
            Arrays.fill(target, 0.0);
            if (rowSensor[r] >= 0) {
                target[rowSensor[r]] = 1.0;
            } else if (rowEnergy[r]) {
                int[] js = rowStates[r];
                double[] sg = rowSigns[r];
                for (int k = 0; k < js.length; k++) {
                    int j = js[k];
                    double f = -sg[k] * flow[j] * ENERGY_ROW_SCALE;
                    double[] dh = dEnthalpy[j];
                    for (int x = 0; x < inputCount; x++) {
                        target[x] += f * dh[x];
                    }
                }
            }
        }
        DenseLinearSolver.solveColumns(matrix, n, permutation, rhsColumns, inputCount, workRows);
        for (int u = 0; u < n; u++) {
            System.arraycopy(rhsColumns[u], 0, dFlow[flowState[u]], 0, inputCount);
        }
    }

    private void evaluateGroups() {
        for (int g = 0; g < groupCount; g++) {
            groupOk[g] = false;
            groupWhy[g] = null;
            double[] d = dGroupValue[g];
            Arrays.fill(d, 0.0);
            int[] s = groupSensors[g];
            for (int i : s) {
                if (!sensorOk[i]) {
                    groupWhy[g] = sensorWhy(i);
                    break;
                }
            }
            if (groupWhy[g] != null) {
                continue;
            }
            int[] k = groupConstants[g];
            switch (groupKind[g]) {
                case G_GENERATOR: {
                    // E = −P/η: the turbines' steam-side Σ m_out h_out − Σ m_in h_in is −W.
                    double p = value[s[0]];
                    double eta = constantValue[k[0]];
                    groupValue[g] = -p / eta;
                    d[s[0]] = -1.0 / eta;
                    d[sensorCount + k[0]] = p / (eta * eta);
                    break;
                }
                case G_COOLING_WATER: {
                    double m = value[s[0]];
                    double hIn;
                    double cpIn;
                    double hOut;
                    double cpOut;
                    try {
                        point.setEnthalpyPT(groupPressure[g], value[s[1]]);
                        hIn = point.h;
                        cpIn = point.dhdT;
                        point.setEnthalpyPT(groupPressure[g], value[s[2]]);
                        hOut = point.h;
                        cpOut = point.dhdT;
                    } catch (SteamRangeException | IllegalStateException e) {
                        groupWhy[g] = "no IF97 state for the cooling water: " + e.getMessage();
                        continue;
                    }
                    // E = −m_cw (h_out − h_in): heat leaves the working fluid.
                    groupValue[g] = -m * (hOut - hIn);
                    d[s[0]] = -(hOut - hIn);
                    d[s[1]] = m * cpIn;
                    d[s[2]] = -m * cpOut;
                    break;
                }
                case G_MOTOR: {
                    double p = value[s[0]];
                    double eta = constantValue[k[0]];
                    groupValue[g] = p * eta;
                    d[s[0]] = eta;
                    d[sensorCount + k[0]] = p;
                    break;
                }
                default: {
                    double m = value[s[0]];
                    double hv = constantValue[k[0]];
                    double eta = constantValue[k[1]];
                    groupValue[g] = m * hv * eta;
                    d[s[0]] = hv * eta;
                    d[sensorCount + k[0]] = m * eta;
                    d[sensorCount + k[1]] = m * hv;
                    break;
                }
            }
            groupOk[g] = true;
        }
    }

    /**
     * The steam side S = Σ m_out h_out − Σ m_in h_in of a group's components, leaving out state
     * {@code skip}, with its gradient added into {@code grad}; false (with the reason in
     * {@code reasons[0]}) when a port it needs is invalid.
     */
    private boolean steamSide(int[] comps, int skip, double[] result, double[] grad, String[] reasons) {
        double sum = 0.0;
        for (int comp : comps) {
            for (int pass = 0; pass < 2; pass++) {
                int[] ports = pass == 0 ? outlets[comp] : inlets[comp];
                double sign = pass == 0 ? 1.0 : -1.0;
                for (int j : ports) {
                    if (j == skip) {
                        continue;
                    }
                    if (!stateOk[j] || !flowKnown[j]) {
                        reasons[0] = "state \"" + stateId[j] + "\" is invalid: " + reasonOf(j);
                        return false;
                    }
                    double m = flow[j];
                    double h = enthalpy[j];
                    sum += sign * m * h;
                    double[] dh = dEnthalpy[j];
                    double[] dm = dFlow[j];
                    double fm = sign * m;
                    double fh = sign * h;
                    for (int x = 0; x < inputCount; x++) {
                        grad[x] += fm * dh[x] + fh * dm[x];
                    }
                }
            }
        }
        result[0] = sum;
        return true;
    }

    private void fixBalanceStates() {
        for (int g = 0; g < groupCount; g++) {
            int j = groupFixes[g];
            if (j < 0) {
                continue;
            }
            if (!pressureKnown[j]) {
                continue;
            }
            if (!groupOk[g]) {
                invalidate(j, "its energy balance cannot be closed: " + groupWhy[g]);
                continue;
            }
            if (!flowKnown[j]) {
                invalidate(j, "its energy balance needs its flow: " + flowWhy[j]);
                continue;
            }
            double m = flow[j] * groupCoefficient[g];
            if (!(Math.abs(flow[j]) > 0.0)) {
                invalidate(j, "its energy balance cannot give an enthalpy at zero flow");
                continue;
            }
            Arrays.fill(gradientPart, 0.0);
            if (!steamSide(groupComponents[g], j, sum1, gradientPart, why1)) {
                invalidate(j, "its energy balance needs " + why1[0]);
                continue;
            }
            double h = (groupValue[g] - sum1[0]) / m;
            try {
                point.setPH(pressure[j], h);
            } catch (SteamRangeException | IllegalStateException e) {
                invalidate(j, "the energy balance of \"" + groupOwner[g] + "\" gives h = " + h
                        + " J/kg, for which there is no IF97 state: " + e.getMessage());
                continue;
            }
            takePoint(j);
            double[] dh = dEnthalpy[j];
            double[] dm = dFlow[j];
            double[] dE = dGroupValue[g];
            double k = groupCoefficient[g];
            for (int x = 0; x < inputCount; x++) {
                dh[x] = (dE[x] - gradientPart[x] - k * h * dm[x]) / m;
            }
            checkExpectedPhase(j, "balanced");
        }
    }

    /** Mixer outlets: h_out = Σ m_in h_in / m_out, adiabatic mixing, with its sensitivities. */
    private void fixMixingStates() {
        for (int j = 0; j < stateCount; j++) {
            if (fix[j] != FIX_MIXING || !pressureKnown[j]) {
                continue;
            }
            int c = mixerOf[j];
            if (!flowKnown[j]) {
                invalidate(j, "the mixing in \"" + componentId[c] + "\" needs its flow: " + flowWhy[j]);
                continue;
            }
            if (!(flow[j] > 0.0)) {
                invalidate(j, "the mixing in \"" + componentId[c] + "\" cannot give an enthalpy at zero flow");
                continue;
            }
            double sum = 0.0;
            String missing = null;
            for (int in : inlets[c]) {
                if (!stateOk[in]) {
                    missing = "state \"" + stateId[in] + "\", which is invalid";
                    break;
                }
                if (!flowKnown[in]) {
                    missing = "the flow of state \"" + stateId[in] + "\": " + flowWhy[in];
                    break;
                }
                sum += flow[in] * enthalpy[in];
            }
            if (missing != null) {
                invalidate(j, "the mixing in \"" + componentId[c] + "\" needs " + missing);
                continue;
            }
            double m = flow[j];
            double h = sum / m;
            try {
                point.setPH(pressure[j], h);
            } catch (SteamRangeException | IllegalStateException e) {
                invalidate(j, "the mixing in \"" + componentId[c] + "\" gives h = " + h
                        + " J/kg, for which there is no IF97 state: " + e.getMessage());
                continue;
            }
            takePoint(j);
            double[] dh = dEnthalpy[j];
            double[] dm = dFlow[j];
            for (int x = 0; x < inputCount; x++) {
                double d = -h * dm[x];
                for (int in : inlets[c]) {
                    d += dFlow[in][x] * enthalpy[in] + flow[in] * dEnthalpy[in][x];
                }
                dh[x] = d / m;
            }
            checkExpectedPhase(j, "mixed");
        }
    }

    private void fixReferenceStates() {
        for (int j = 0; j < stateCount; j++) {
            if (fix[j] != FIX_ISENTROPIC) {
                continue;
            }
            int from = isentropicFrom[j];
            int at = isentropicPressureOf[j];
            if (!stateOk[from]) {
                stateWhy[j] = "its entropy comes from state \"" + stateId[from] + "\", which is invalid";
                continue;
            }
            if (!pressureKnown[at] || !stateOk[at]) {
                stateWhy[j] = "its pressure comes from state \"" + stateId[at] + "\", which is invalid";
                continue;
            }
            try {
                point.setPS(pressure[at], entropy[from]);
            } catch (SteamRangeException | IllegalStateException e) {
                stateWhy[j] = "no IF97 state at the isentropic pressure and entropy: " + e.getMessage();
                continue;
            }
            pressureKnown[j] = true;
            takePoint(j);
        }
    }

    private String reasonOf(int j) {
        if (stateWhy[j] != null) {
            return stateWhy[j];
        }
        return flowWhy[j] != null ? flowWhy[j] : "invalid";
    }

    /** Heat and work of every component whose ports are all valid with known flows. */
    private void evaluateComponents() {
        for (int c = 0; c < componentCount; c++) {
            componentOk[c] = true;
            componentWhy[c] = null;
            componentHeat[c] = 0.0;
            componentWork[c] = 0.0;
            if (kind[c] == C_GENERATOR) {
                int g = componentGroup[c];
                int ps = groupSensors[g][0];
                if (sensorOk[ps]) {
                    componentWork[c] = value[ps];
                } else {
                    componentOk[c] = false;
                    componentWhy[c] = sensorWhy(ps);
                }
                continue;
            }
            double s = 0.0;
            for (int pass = 0; pass < 2 && componentOk[c]; pass++) {
                int[] ports = pass == 0 ? outlets[c] : inlets[c];
                for (int j : ports) {
                    if (!stateOk[j] || !flowKnown[j]) {
                        componentOk[c] = false;
                        componentWhy[c] = "state \"" + stateId[j] + "\" is invalid: " + reasonOf(j);
                        break;
                    }
                    s += (pass == 0 ? 1.0 : -1.0) * flow[j] * enthalpy[j];
                }
            }
            if (!componentOk[c]) {
                continue;
            }
            switch (kind[c]) {
                case C_STEAM_GENERATOR, C_REHEATER, C_CONDENSER -> componentHeat[c] = s;
                case C_TURBINE, C_PUMP -> componentWork[c] = -s;
                default -> {
                    // Adiabatic and without work: the flows were solved from this balance.
                }
            }
        }
    }

    // ================================================================ results

    private List<StateResult> stateResults() {
        List<StateResult> results = new ArrayList<>(stateCount);
        for (int j = 0; j < stateCount; j++) {
            boolean props = propertiesKnown[j];
            boolean hasFlow = flowIndex[j] >= 0;
            boolean valid = stateOk[j] && stateWhy[j] == null && (!hasFlow || flowKnown[j]);
            String why = stateWhy[j] != null ? stateWhy[j] : hasFlow && !flowKnown[j] ? flowWhy[j] : null;
            if (!valid && why == null) {
                why = "invalid";
            }
            results.add(new StateResult(stateId[j],
                    pressureKnown[j] ? OptionalDouble.of(pressure[j]) : OptionalDouble.empty(),
                    props || fix[j] == FIX_PT && temperatureSensor[j] >= 0 && sensorOk[temperatureSensor[j]]
                            ? OptionalDouble.of(temperature[j]) : OptionalDouble.empty(),
                    props ? OptionalDouble.of(enthalpy[j]) : OptionalDouble.empty(),
                    props ? OptionalDouble.of(entropy[j]) : OptionalDouble.empty(),
                    props ? OptionalDouble.of(volume[j]) : OptionalDouble.empty(),
                    props && twoPhase[j] ? OptionalDouble.of(quality[j]) : OptionalDouble.empty(),
                    props ? Optional.of(phaseOf(phase[j])) : Optional.empty(),
                    props && marginKnown[j] ? OptionalDouble.of(margin[j]) : OptionalDouble.empty(),
                    hasFlow && flowKnown[j] ? OptionalDouble.of(flow[j]) : OptionalDouble.empty(),
                    valid, Optional.ofNullable(valid ? null : why)));
        }
        return results;
    }

    private static Phase phaseOf(int code) {
        return switch (code) {
            case PHASE_LIQUID -> Phase.LIQUID;
            case PHASE_TWO -> Phase.TWO_PHASE;
            case PHASE_VAPOUR -> Phase.VAPOUR;
            default -> Phase.SUPERCRITICAL;
        };
    }

    private List<ComponentResult> componentResults() {
        List<ComponentResult> results = new ArrayList<>(componentCount);
        for (int c = 0; c < componentCount; c++) {
            if (!componentOk[c]) {
                results.add(new ComponentResult(componentId[c], componentType[c], OptionalDouble.empty(),
                        OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(), false,
                        Optional.of(componentWhy[c])));
                continue;
            }
            if (kind[c] == C_GENERATOR) {
                double eta = constantValue[groupConstants[componentGroup[c]][0]];
                double losses = componentWork[c] * (1.0 / eta - 1.0);
                results.add(new ComponentResult(componentId[c], componentType[c], OptionalDouble.empty(),
                        OptionalDouble.of(componentWork[c]), OptionalDouble.empty(), OptionalDouble.of(losses), true,
                        Optional.empty()));
                continue;
            }
            results.add(new ComponentResult(componentId[c], componentType[c], OptionalDouble.of(componentHeat[c]),
                    OptionalDouble.of(componentWork[c]), isentropicEfficiency(c), exergyDestruction(c), true,
                    Optional.empty()));
        }
        return results;
    }

    private OptionalDouble isentropicEfficiency(int c) {
        int ideal = idealOutlet[c];
        if (ideal < 0 || !stateOk[ideal]) {
            return OptionalDouble.empty();
        }
        double hIn = enthalpy[inlets[c][0]];
        double hOut = enthalpy[outlets[c][outlets[c].length - 1]];
        double hs = enthalpy[ideal];
        double eta = kind[c] == C_TURBINE ? (hIn - hOut) / (hIn - hs) : (hs - hIn) / (hOut - hIn);
        return Double.isFinite(eta) ? OptionalDouble.of(eta) : OptionalDouble.empty();
    }

    private OptionalDouble exergyDestruction(int c) {
        double generated = 0.0;
        for (int j : outlets[c]) {
            generated += flow[j] * entropy[j];
        }
        for (int j : inlets[c]) {
            generated -= flow[j] * entropy[j];
        }
        if (kind[c] == C_CONDENSER) {
            generated -= componentHeat[c] / condenserBoundaryTemperature(c);
        }
        return OptionalDouble.of(deadStateTemperatureK * generated);
    }

    /** The cooling water's entropic mean temperature when measured, else T0. */
    private double condenserBoundaryTemperature(int c) {
        int g = componentGroup[c];
        if (g < 0 || !groupOk[g]) {
            return deadStateTemperatureK;
        }
        double tIn = value[groupSensors[g][1]];
        double tOut = value[groupSensors[g][2]];
        if (Math.abs(tOut - tIn) <= EQUAL_TEMPERATURE_TOLERANCE * tIn) {
            return 0.5 * (tIn + tOut);
        }
        return (tOut - tIn) / Math.log(tOut / tIn);
    }

    private CycleResult cycleResult() {
        boolean addedOk = true;
        boolean rejectedOk = true;
        boolean turbineOk = true;
        boolean pumpOk = true;
        double added = 0.0;
        double rejected = 0.0;
        double turbine = 0.0;
        double pump = 0.0;
        double entropyIn = 0.0;
        double entropyOut = 0.0;
        for (int c = 0; c < componentCount; c++) {
            switch (kind[c]) {
                case C_STEAM_GENERATOR, C_REHEATER -> {
                    addedOk &= componentOk[c];
                    if (componentOk[c]) {
                        added += componentHeat[c];
                        entropyIn += entropyChange(c);
                    }
                }
                case C_CONDENSER -> {
                    rejectedOk &= componentOk[c];
                    if (componentOk[c]) {
                        rejected -= componentHeat[c];
                        entropyOut -= entropyChange(c);
                    }
                }
                case C_TURBINE -> {
                    turbineOk &= componentOk[c];
                    turbine += componentOk[c] ? componentWork[c] : 0.0;
                }
                case C_PUMP -> {
                    pumpOk &= componentOk[c];
                    pump -= componentOk[c] ? componentWork[c] : 0.0;
                }
                default -> {
                    // Heaters and mixers carry no heat or work; a generator's output is not shaft work.
                }
            }
        }
        boolean netOk = turbineOk && pumpOk;
        double net = turbine - pump;
        boolean etaOk = netOk && addedOk && added > 0.0;
        double eta = etaOk ? net / added : 0.0;
        double tMin = Double.POSITIVE_INFINITY;
        double tMax = 0.0;
        for (int j = 0; j < stateCount; j++) {
            if (flowIndex[j] >= 0 && stateOk[j]) {
                tMin = Math.min(tMin, temperature[j]);
                tMax = Math.max(tMax, temperature[j]);
            }
        }
        boolean carnotOk = tMax > 0.0;
        boolean meanOk = addedOk && rejectedOk && entropyIn > 0.0 && entropyOut > 0.0 && added > 0.0;
        double meanIn = meanOk ? added / entropyIn : 0.0;
        double meanOut = meanOk ? rejected / entropyOut : 0.0;
        return new CycleResult(
                optional(addedOk, added),
                optional(rejectedOk, rejected),
                optional(turbineOk, turbine),
                optional(pumpOk, pump),
                optional(netOk, net),
                optional(etaOk, eta),
                optional(netOk && turbine > 0.0, pump / turbine),
                optional(etaOk && eta > 0.0, 3600.0 / eta),
                optional(carnotOk, 1.0 - tMin / tMax),
                optional(meanOk, 1.0 - meanOut / meanIn));
    }

    /** Σ m_out s_out − Σ m_in s_in of a component whose ports are valid. */
    private double entropyChange(int c) {
        double ds = 0.0;
        for (int j : outlets[c]) {
            ds += flow[j] * entropy[j];
        }
        for (int j : inlets[c]) {
            ds -= flow[j] * entropy[j];
        }
        return ds;
    }

    private static OptionalDouble optional(boolean known, double v) {
        return known && Double.isFinite(v) ? OptionalDouble.of(v) : OptionalDouble.empty();
    }

    private List<ClosureResult> closureResults() {
        List<ClosureResult> results = new ArrayList<>(groupCount + 1);
        ClosureResult cycle = cycleClosure();
        if (cycle != null) {
            results.add(cycle);
        }
        for (int g = 0; g < groupCount; g++) {
            if (groupFixes[g] >= 0 || !groupOk[g]) {
                continue;
            }
            Arrays.fill(gradient, 0.0);
            if (!steamSide(groupComponents[g], -1, sum1, gradient, why1)) {
                continue;
            }
            double sign = groupSign[g];
            double r = sign * (sum1[0] - groupValue[g]);
            double[] dE = dGroupValue[g];
            for (int x = 0; x < inputCount; x++) {
                gradient[x] = sign * (gradient[x] - dE[x]);
            }
            ClosureResult result = closure(groupClosureId[g], r);
            if (result != null) {
                results.add(result);
            }
        }
        return results;
    }

    /**
     * Heat added − heat rejected − net work, each term independent where a valid measurement
     * exists: the steam side of every heat and work component, with each independent group's
     * steam side replaced by its measurement.
     */
    private ClosureResult cycleClosure() {
        Arrays.fill(gradient, 0.0);
        boolean anyIndependent = false;
        for (int g = 0; g < groupCount; g++) {
            anyIndependent |= groupFixes[g] < 0 && groupOk[g];
        }
        if (!anyIndependent) {
            return null;
        }
        double r = 0.0;
        for (int c = 0; c < componentCount; c++) {
            int k = kind[c];
            if (k == C_STEAM_GENERATOR || k == C_REHEATER || k == C_CONDENSER || k == C_TURBINE || k == C_PUMP) {
                if (!steamSide(singleComponent[c], -1, sum1, gradient, why1)) {
                    return null;
                }
                r += sum1[0];
            }
        }
        for (int g = 0; g < groupCount; g++) {
            if (groupFixes[g] >= 0 || !groupOk[g]) {
                continue;
            }
            Arrays.fill(gradientPart, 0.0);
            if (!steamSide(groupComponents[g], -1, sum1, gradientPart, why1)) {
                return null;
            }
            r += groupValue[g] - sum1[0];
            double[] dE = dGroupValue[g];
            for (int x = 0; x < inputCount; x++) {
                gradient[x] += dE[x] - gradientPart[x];
            }
        }
        return closure("cycle", r);
    }

    /** The closure entry from r and the gradient in {@link #gradient}, or null when u(r) is not positive. */
    private ClosureResult closure(String id, double r) {
        double variance = 0.0;
        for (int i = 0; i < sensorCount; i++) {
            double term = gradient[i] * sensorUncertainty[i];
            variance += term * term;
        }
        for (int k = 0; k < constantValue.length; k++) {
            double term = gradient[sensorCount + k] * constantUncertainty[k];
            variance += term * term;
        }
        double sigma = Math.sqrt(variance);
        if (!(sigma > 0.0) || !Double.isFinite(sigma) || !Double.isFinite(r)) {
            return null;
        }
        return new ClosureResult(id, r, sigma, r / sigma);
    }

    // ================================================================ for tests in this package

    int constantCount() {
        return constantValue.length;
    }

    double constantValue(int k) {
        return constantValue[k];
    }

    double constantUncertainty(int k) {
        return constantUncertainty[k];
    }

    /** Replaces a declared constant's value, for a Monte Carlo propagation over the constants. */
    void setConstantValue(int k, double v) {
        constantValue[k] = v;
    }
}
