package org.steamtally.calc.reconcile;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.cycle.ReconciledQuantity;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.Suspect;
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

/**
 * Data reconciliation of one unit after VDI 2048 Part 1 (VDI 2048 Blatt 1, "Uncertainties of
 * measurement during acceptance tests on energy-conversion and power plants — Fundamentals",
 * Verein Deutscher Ingenieure, October 2000; the quality criterion, the global and individual tests
 * and the correction by weighted least squares under the balances as constraints are its method;
 * a later revision of the guideline, recalled from memory, keeps them): the measured values x are
 * adjusted by v, within their standard uncertainties u, so that every mass and energy balance of
 * the unit holds exactly, and the unmeasured quantities y are solved at the same time.
 *
 * <h2>The problem</h2>
 * Minimise the quality criterion Σ (v_i / u_i)² = vᵀ S_x⁻¹ v (S_x diagonal: the sensors' and the
 * declared constants' uncertainties, taken as uncorrelated) subject to f(x + v, y) = 0, where f
 * holds, for every component, its mass balance (a closed feedwater heater has two, tubes and shell),
 * for every check-flow meter m_state = m_meter, for every duplicate transmitter (a sensor declared
 * {@code same_measurand_as} another) x_primary = x_duplicate, and, where it is known, its energy balance:
 * <ul>
 *   <li>adiabatic balances of open and closed feedwater heaters and mixers, Σ m_in h_in − Σ m_out h_out = 0;</li>
 *   <li>the steam side of a component against its independent measurement: turbine sections on a
 *       generator's shaft against P_el / η_gen, a condenser against its cooling-water duty
 *       m_cw (h(p_cw, T_out) − h(p_cw, T_in)), a pump against η_motor P_el, a steam generator (with
 *       the reheaters, when it is the unit's only one) against η_boiler m_fuel HV.</li>
 * </ul>
 * Enthalpies of measured states are IF97 functions of the measured p and T (or of p on the
 * saturation line), so the constraints are non-linear in x. Measured quantities are every GOOD,
 * plausible sensor the balances use, and every declared constant with an uncertainty (efficiencies,
 * heating values) as a quasi-measurement. Unmeasured quantities: unmetered flows, the enthalpy of a
 * state fixed by an energy balance (a wet exhaust), and the enthalpy of a state whose sensors have
 * no usable value; a balance whose independent measurement has no usable value is left out. Stale
 * or missing sensors so lower the redundancy; they never stop the reconciliation.
 *
 * <h2>Solution</h2>
 * Gauss–Newton with constraint projection (VDI 2048-1, section on non-linear constraints: repeated
 * linearisation about the latest estimate). At (x_k, y_k), with A = ∂f/∂x, B = ∂f/∂y and
 * x = x_m + S^{1/2} e: r + A S^{1/2} e + B Δy = 0, r = f(x_k, y_k) + A (x_m − x_k). A QR
 * factorisation with column pivoting of B splits the constraints into those that fix y and the
 * remainder Q₂ᵀ, free of y: G e = −Q₂ᵀ r with G = Q₂ᵀ A S^{1/2}. The least-norm e is
 * e = −G⁺ Q₂ᵀ r, which for full row rank is the closed form x̂ = x − S Aᵀ (A S Aᵀ)⁻¹ A x of
 * VDI 2048-1 for linear constraints; Δy then follows from the first rank(B) rows. Iterate until
 * the largest step is below 1e-6 u and every balance closes to 1e-6 (kg/s, or MW for energy rows),
 * at most 30 linearisations; otherwise the result says {@code not_converged} and why.
 *
 * <h2>Quality tests (VDI 2048-1)</h2>
 * <ul>
 *   <li>Global test: χ² = Σ (v_i / u_i)² against the χ² quantile at 95 % for the redundancy degree
 *       rank(G) ({@link ChiSquare#quantile}).</li>
 *   <li>Individual tests: |v_i| / σ(v_i) against the two-sided normal quantile (1.96 at 95 %), with
 *       the covariance of the normalised adjustments S^{-1/2} S_v S^{-1/2} = G⁺G, the projection on the
 *       row space of G (P below); σ(v_i) = u_i √P_ii.</li>
 *   <li>Reconciled uncertainties: u(x̂_i) = u_i √(1 − P_ii); for y, u²(ŷ) from the first-order
 *       propagation of S_x̂ = S^{1/2} (I − P) S^{1/2} through the rows of the constraints that fix y.</li>
 * </ul>
 * Redundancy report: a measured quantity with P_ii &gt; 1e-8 is redundant (its adjustment is
 * checked), otherwise just determined (no check possible); an unmeasured quantity is unobservable
 * when the null space of B has a component along it.
 *
 * <h2>Gross-error identification</h2>
 * When the global test fails: the redundant quantity with the largest individual test value is
 * removed (made unmeasured, so its value is estimated from the rest) and the reconciliation re-run;
 * serial elimination repeats, at most three times, until the global test passes. Each removed one is
 * a suspect, with every quantity whose adjustment is correlated with its own by |ρ| ≥ 0.99 as its
 * equivalence set: a bias on one moves the other's test value by at least 99 % as much, less than
 * measurement noise can separate, so the balances cannot tell them apart. Perfectly correlated
 * members have equal test values; the set is ordered by the gross error each member would need to
 * explain the data, |v_i| / (u_i P_ii) in its own standard uncertainties, smallest first, and the
 * first is the one named and removed, unless removing another member lets the rest fit clearly
 * better (it converges where the first does not, or its χ² is lower by more than 0.1): a gross error
 * that takes a state out of its region is told apart by the non-linear balances although the
 * linearised ones cannot. That order is a judgement of plausibility, not a finding of the balances:
 * the whole set is reported. A declared duplicate pair (a sensor and its {@code same_measurand_as}
 * partner) is put in one set from |ρ| ≥ {@link #PAIR_EQUIVALENCE_CORRELATION}.
 *
 * <p>Not thread-safe: {@link #reconcile} works in arrays the instance holds ({@link ReconcilerWorkspace}),
 * sized when the unit is compiled and reused by every snapshot, so one instance serves one thread
 * at a time (the daemon gives each unit its own thread and its own evaluators). No result of a
 * snapshot depends on the ones before it: every call gives what a freshly compiled instance would,
 * and everything it returns is the caller's own. {@link #balancesOf} and {@link #quantityIds} read
 * only what compilation fixed and are safe from any thread.
 */
public final class Reconciler {

    /** Confidence level of the global and individual tests (VDI 2048-1 default). */
    public static final double CONFIDENCE = 0.95;
    /** Correlation of two adjustments above which the balances cannot tell the two quantities apart. */
    public static final double EQUIVALENCE_CORRELATION = 0.99;
    /**
     * Correlation above which a declared duplicate pair (a sensor and its {@code same_measurand_as}
     * partner) is reported as one equivalence set. Lower than {@link #EQUIVALENCE_CORRELATION}
     * because for a pair the question is only which of the two is off: a bias on one gives the
     * other a test value |ρ| times as large, so at a test value of 10 (a 3σ bias on a window mean)
     * and |ρ| = 0.9 the two differ by 1 against a noise of √(2 (1 − |ρ|)) = 0.45 in their
     * difference, about two standard deviations. Above 0.9 naming one of the two would be close to
     * a coin toss, so both are named; the balances' coupling is then too weak to judge between them.
     */
    public static final double PAIR_EQUIVALENCE_CORRELATION = 0.9;
    /** Serial elimination removes at most this many quantities. */
    public static final int MAX_SUSPECTS = 3;
    /** Linearisations before giving up. */
    public static final int MAX_ITERATIONS = 30;

    /** Largest normalised step |Δx| / u at convergence. */
    private static final double STEP_TOLERANCE = 1e-6;
    /** Largest balance residual at convergence, kg/s for mass rows and MW for energy rows. */
    private static final double RESIDUAL_TOLERANCE = 1e-6;
    /** Energy rows in MW, so that their coefficients are of the order of the mass rows'. */
    private static final double ENERGY_SCALE = 1e-6;
    /**
     * Rank decisions: a pivot below this fraction of the largest column norm is zero. Structural
     * zeros come out near 1e-16; genuine coefficients of balances of a few hundred kg/s and MW
     * stay above 1e-6 of the largest.
     */
    private static final double RANK_TOLERANCE = 1e-10;
    /** P_ii above this: the quantity is redundant. */
    private static final double REDUNDANT_TOLERANCE = 1e-8;
    /** A null-space component above this (in equilibrated columns) makes an unknown unobservable. */
    private static final double NULL_SPACE_TOLERANCE = 1e-8;

    private static final int UNUSED = 0;
    private static final int MEASURED = 1;
    private static final int UNKNOWN = 2;
    private static final int FIXED = 3;

    private static final int H_PT = 0;
    private static final int H_PX = 1;
    private static final int H_BALANCE = 2;

    private static final int ROW_MASS = 0;
    private static final int ROW_ADIABATIC = 1;
    private static final int ROW_GENERATOR = 2;
    private static final int ROW_COOLING_WATER = 3;
    private static final int ROW_MOTOR = 4;
    private static final int ROW_FUEL = 5;
    private static final int ROW_METER = 6;
    /** x_primary − x_duplicate = 0, in standard uncertainties of the difference: a duplicate transmitter. */
    private static final int ROW_SAME = 7;

    private final String unitId;
    private final Sensor[] sensors;
    private final int sensorCount;
    private final boolean[] inModel;
    /** Per sensor, the index of the sensor whose value it measures: itself, or its primary for a duplicate. */
    private final int[] measurandOf;
    private final String[] constantId;
    private final double[] constantValue;
    private final double[] constantSigma;
    private final int inputCount;
    /** Per input, the declared standard uncertainty: the sensors', then the constants'. */
    private final double[] declaredSigma;

    private final int stateCount;
    private final String[] stateId;
    /** Per flowing state, the ids its unmeasured flow and enthalpy are reported under, made once. */
    private final String[] flowQuantityId;
    private final String[] enthalpyQuantityId;
    private final int[] hMode;
    private final int[] pSensor;
    private final int[] tSensor;
    private final int[] flowSensor;
    private final double[] quality;

    private final int rowCount;
    private final int[] rowKind;
    private final int[][] rowStates;
    private final double[][] rowSigns;
    /** Inputs of the independent side: sensors, then constants as input indices. */
    private final int[][] rowInputs;
    private final double[] rowPressure;
    private final String[] rowLabel;

    private final double[] chi2Limit;
    private final double testLimit;
    /** Per measured or declared quantity, the labels of the balances it enters; fixed at compile time. */
    private final Map<String, List<String>> balancesByQuantity;

    /** Working arrays of {@link #reconcile}, reused from snapshot to snapshot; see {@link ReconcilerWorkspace}. */
    private final ReconcilerWorkspace workspace;
    /**
     * Solutions no reconciliation refers to any more, for the next one to take: a snapshot holds at
     * most four at a time (the first fit, the current and next step of serial elimination, and an
     * alternative member of an equivalence set).
     */
    private final ArrayDeque<Solution> spareSolutions = new ArrayDeque<>();

    private Reconciler(UnitDescription unit) {
        unitId = unit.id();
        sensors = unit.sensors().toArray(new Sensor[0]);
        sensorCount = sensors.length;
        Map<String, Integer> sensorIndex = new HashMap<>();
        for (int i = 0; i < sensorCount; i++) {
            sensorIndex.put(sensors[i].id(), i);
        }
        inModel = new boolean[sensorCount];
        measurandOf = new int[sensorCount];
        for (int i = 0; i < sensorCount; i++) {
            measurandOf[i] = i;
            if (sensors[i].sameMeasurandAs().isPresent()) {
                measurandOf[i] = sensor(sensorIndex, sensors[i].sameMeasurandAs().get(), sensors[i].quantity());
            }
        }

        Map<String, Integer> stateIndex = new HashMap<>();
        List<StateDefinition> flowing = new ArrayList<>();
        for (StateDefinition s : unit.states()) {
            if (!s.isReference()) {
                stateIndex.put(s.id(), flowing.size());
                flowing.add(s);
            }
        }
        stateCount = flowing.size();
        stateId = new String[stateCount];
        flowQuantityId = new String[stateCount];
        enthalpyQuantityId = new String[stateCount];
        hMode = new int[stateCount];
        pSensor = new int[stateCount];
        tSensor = new int[stateCount];
        flowSensor = new int[stateCount];
        quality = new double[stateCount];
        for (int j = 0; j < stateCount; j++) {
            StateDefinition s = flowing.get(j);
            stateId[j] = s.id();
            flowQuantityId[j] = s.id() + ".m_kg_per_s";
            enthalpyQuantityId[j] = s.id() + ".h_J_per_kg";
            tSensor[j] = -1;
            flowSensor[j] = s.flowSensor().map(id -> sensor(sensorIndex, id, Quantity.MASS_FLOW)).orElse(-1);
            StateFix f = s.fix();
            if (f instanceof StateFix.MeasuredPressureTemperature pt) {
                hMode[j] = H_PT;
                pSensor[j] = sensor(sensorIndex, pt.pressureSensor(), Quantity.PRESSURE);
                tSensor[j] = sensor(sensorIndex, pt.temperatureSensor(), Quantity.TEMPERATURE);
            } else if (f instanceof StateFix.SaturatedLiquid sl) {
                hMode[j] = H_PX;
                pSensor[j] = sensor(sensorIndex, sl.pressureSensor(), Quantity.PRESSURE);
            } else if (f instanceof StateFix.SaturatedVapour sv) {
                hMode[j] = H_PX;
                quality[j] = 1.0;
                pSensor[j] = sensor(sensorIndex, sv.pressureSensor(), Quantity.PRESSURE);
            } else if (f instanceof StateFix.PressureQuality pq) {
                hMode[j] = H_PX;
                quality[j] = pq.quality();
                pSensor[j] = sensor(sensorIndex, pq.pressureSensor(), Quantity.PRESSURE);
            } else {
                StateFix.EnergyBalance eb = (StateFix.EnergyBalance) f;
                hMode[j] = H_BALANCE;
                pSensor[j] = sensor(sensorIndex, eb.pressureSensor(), Quantity.PRESSURE);
            }
            inModel[pSensor[j]] = true;
            if (tSensor[j] >= 0) {
                inModel[tSensor[j]] = true;
            }
            if (flowSensor[j] >= 0) {
                inModel[flowSensor[j]] = true;
            }
        }

        List<String> cIds = new ArrayList<>();
        List<Double> cValues = new ArrayList<>();
        List<Double> cSigmas = new ArrayList<>();
        List<Integer> kinds = new ArrayList<>();
        List<int[]> states = new ArrayList<>();
        List<double[]> signs = new ArrayList<>();
        List<int[]> inputs = new ArrayList<>();
        List<Double> pressures = new ArrayList<>();
        List<String> labels = new ArrayList<>();
        Map<String, Component> byId = new LinkedHashMap<>();
        int steamGenerators = 0;
        for (Component c : unit.components()) {
            byId.put(c.id(), c);
            if (c instanceof Component.SteamGenerator) {
                steamGenerators++;
            }
        }
        for (Component c : unit.components()) {
            if (c instanceof Component.Generator) {
                continue;
            }
            if (c instanceof Component.ClosedFeedwaterHeater h) {
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_MASS,
                        ports(stateIndex, List.of(h.feedwaterInlet()), List.of(h.feedwaterOutlet())), new int[0], 0.0,
                        "tube-side mass balance of " + c.id());
                List<String> shellIn = new ArrayList<>();
                shellIn.add(h.steamInlet());
                shellIn.addAll(h.drainInlets());
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_MASS,
                        ports(stateIndex, shellIn, List.of(h.drainOutlet())), new int[0], 0.0,
                        "shell-side mass balance of " + c.id());
            } else {
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_MASS,
                        ports(stateIndex, c.inlets(), c.outlets()), new int[0], 0.0, "mass balance of " + c.id());
            }
            if (c instanceof Component.ClosedFeedwaterHeater || c instanceof Component.OpenFeedwaterHeater
                    || c instanceof Component.Mixer) {
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_ADIABATIC,
                        ports(stateIndex, c.inlets(), c.outlets()), new int[0], 0.0, "energy balance of " + c.id());
            }
        }
        for (StateDefinition s : flowing) {
            if (s.checkFlowSensor().isPresent()) {
                // m_state − m_meter = 0: a second meter on a stream, checked by the balances
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_METER,
                        new Object[] {new int[] {stateIndex.get(s.id())}, new double[] {1.0}},
                        new int[] {sensor(sensorIndex, s.checkFlowSensor().get(), Quantity.MASS_FLOW)}, 0.0,
                        "check flow " + s.checkFlowSensor().get() + " on " + s.id());
            }
        }
        for (int i = 0; i < sensorCount; i++) {
            if (measurandOf[i] != i) {
                // x_primary − x_duplicate = 0: one more redundancy degree, which checks the pair's difference
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_SAME,
                        new Object[] {new int[0], new double[0]}, new int[] {measurandOf[i], i}, 0.0,
                        "same measurand " + sensors[measurandOf[i]].id() + " = " + sensors[i].id());
            }
        }
        for (Component c : unit.components()) {
            if (c instanceof Component.Generator g) {
                List<String> in = new ArrayList<>();
                List<String> out = new ArrayList<>();
                for (String t : g.turbines()) {
                    Component turbine = byId.get(t);
                    if (turbine == null) {
                        throw new IllegalArgumentException("generator \"" + g.id() + "\" names turbine \"" + t
                                + "\", which is not a component of unit \"" + unitId + "\"");
                    }
                    in.addAll(turbine.inlets());
                    out.addAll(turbine.outlets());
                }
                int power = sensor(sensorIndex, g.powerSensor(), Quantity.POWER);
                int eta = constant(cIds, cValues, cSigmas, g.id() + ".efficiency", g.efficiency());
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_GENERATOR, ports(stateIndex, in, out),
                        new int[] {power, eta}, 0.0, "energy balance of " + String.join("+", g.turbines()) + "+" + g.id());
            } else if (c instanceof Component.Condenser cond && cond.coolingWater().isPresent()) {
                CoolingWater cw = cond.coolingWater().get();
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_COOLING_WATER,
                        ports(stateIndex, c.inlets(), c.outlets()),
                        new int[] {sensor(sensorIndex, cw.flowSensor(), Quantity.MASS_FLOW),
                                sensor(sensorIndex, cw.inletTemperatureSensor(), Quantity.TEMPERATURE),
                                sensor(sensorIndex, cw.outletTemperatureSensor(), Quantity.TEMPERATURE)},
                        cw.pressurePa(), "energy balance of " + c.id() + "+cooling_water");
            } else if (c instanceof Component.Pump pump && pump.motor().isPresent()) {
                MotorMeasurement motor = pump.motor().get();
                int power = sensor(sensorIndex, motor.powerSensor(), Quantity.POWER);
                int eta = constant(cIds, cValues, cSigmas, pump.id() + ".motor_efficiency", motor.efficiency());
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_MOTOR,
                        ports(stateIndex, c.inlets(), c.outlets()), new int[] {power, eta}, 0.0,
                        "energy balance of " + c.id() + "+motor");
            } else if (c instanceof Component.SteamGenerator sg && sg.fuel().isPresent()) {
                FuelMeasurement fuel = sg.fuel().get();
                List<String> in = new ArrayList<>(c.inlets());
                List<String> out = new ArrayList<>(c.outlets());
                if (steamGenerators == 1) {
                    for (Component other : unit.components()) {
                        if (other instanceof Component.Reheater) {
                            in.addAll(other.inlets());
                            out.addAll(other.outlets());
                        }
                    }
                }
                int m = sensor(sensorIndex, fuel.flowSensor(), Quantity.MASS_FLOW);
                int hv = constant(cIds, cValues, cSigmas, sg.id() + ".heating_value", fuel.heatingValueJPerKg());
                int eta = constant(cIds, cValues, cSigmas, sg.id() + ".boiler_efficiency", fuel.boilerEfficiency());
                addRow(kinds, states, signs, inputs, pressures, labels, ROW_FUEL, ports(stateIndex, in, out),
                        new int[] {m, hv, eta}, 0.0, "energy balance of " + c.id() + "+fuel");
            }
        }
        constantId = cIds.toArray(new String[0]);
        constantValue = cValues.stream().mapToDouble(Double::doubleValue).toArray();
        constantSigma = cSigmas.stream().mapToDouble(Double::doubleValue).toArray();
        inputCount = sensorCount + constantId.length;
        declaredSigma = inputSigma(SensorUncertainties.declared(unit.sensors()));
        rowCount = kinds.size();
        rowKind = kinds.stream().mapToInt(Integer::intValue).toArray();
        rowStates = states.toArray(new int[0][]);
        rowSigns = signs.toArray(new double[0][]);
        rowInputs = new int[rowCount][];
        for (int r = 0; r < rowCount; r++) {
            int[] in = inputs.get(r).clone();
            // Constant slots were recorded as -(k + 1): turn them into input indices now that the sensor count is fixed.
            for (int q = 0; q < in.length; q++) {
                if (in[q] < 0) {
                    in[q] = sensorCount + (-in[q] - 1);
                } else {
                    inModel[in[q]] = true;
                }
            }
            rowInputs[r] = in;
        }
        rowPressure = pressures.stream().mapToDouble(Double::doubleValue).toArray();
        rowLabel = labels.toArray(new String[0]);
        chi2Limit = new double[rowCount + inputCount + 1];
        for (int k = 1; k < chi2Limit.length; k++) {
            chi2Limit[k] = ChiSquare.quantile(CONFIDENCE, k);
        }
        testLimit = ChiSquare.normalTwoSided(CONFIDENCE);
        balancesByQuantity = participation();
        workspace = new ReconcilerWorkspace(rowCount, inputCount, stateCount, inputCount + 2 * stateCount);
    }

    /**
     * Which balances each quantity enters: the non-zero pattern of the columns of ∂f/∂x. A mass
     * balance or check-flow row holds the flows of its states; an energy row also the enthalpies of
     * its states, so the p (and T) sensors that fix them, and its independent side's inputs. The
     * pressure of a state whose enthalpy comes from an energy balance enters no row.
     */
    private Map<String, List<String>> participation() {
        Map<Integer, LinkedHashSet<String>> byInput = new LinkedHashMap<>();
        for (int r = 0; r < rowCount; r++) {
            boolean energy = rowKind[r] != ROW_MASS && rowKind[r] != ROW_METER && rowKind[r] != ROW_SAME;
            String label = rowLabel[r];
            for (int j : rowStates[r]) {
                if (flowSensor[j] >= 0) {
                    byInput.computeIfAbsent(flowSensor[j], q -> new LinkedHashSet<>()).add(label);
                }
                if (energy && hMode[j] != H_BALANCE) {
                    byInput.computeIfAbsent(pSensor[j], q -> new LinkedHashSet<>()).add(label);
                    if (tSensor[j] >= 0) {
                        byInput.computeIfAbsent(tSensor[j], q -> new LinkedHashSet<>()).add(label);
                    }
                }
            }
            for (int q : rowInputs[r]) {
                // a constant declared without uncertainty is fixed, not a quantity that could be suspect
                if (q < sensorCount || constantSigma[q - sensorCount] > 0.0) {
                    byInput.computeIfAbsent(q, k -> new LinkedHashSet<>()).add(label);
                }
            }
        }
        Map<String, List<String>> out = new HashMap<>();
        byInput.forEach((q, labels) -> out.put(inputId(q), List.copyOf(labels)));
        return Map.copyOf(out);
    }

    /**
     * Prepares the reconciliation of a unit: its balances, measured and unmeasured quantities and
     * the χ² limits for every possible redundancy degree.
     *
     * @param unit a unit description that the cycle model accepts
     * @throws IllegalArgumentException when a reference of the unit does not resolve
     */
    public static Reconciler compile(UnitDescription unit) {
        return new Reconciler(unit);
    }

    private int sensor(Map<String, Integer> index, String id, Quantity quantity) {
        Integer i = index.get(id);
        if (i == null || sensors[i].quantity() != quantity) {
            throw new IllegalArgumentException("unit \"" + unitId + "\" has no " + quantity.label() + " sensor \""
                    + id + "\"");
        }
        return i;
    }

    private static int constant(List<String> ids, List<Double> values, List<Double> sigmas, String id,
                                UncertainConstant c) {
        ids.add(id);
        values.add(c.value());
        sigmas.add(c.standardUncertainty());
        return -ids.size();
    }

    /** Ports with their signs, + for an inlet, − for an outlet, a state on both sides summed. */
    private Object[] ports(Map<String, Integer> stateIndex, List<String> in, List<String> out) {
        Map<Integer, Double> sign = new LinkedHashMap<>();
        for (int side = 0; side < 2; side++) {
            for (String id : side == 0 ? in : out) {
                Integer j = stateIndex.get(id);
                if (j == null) {
                    throw new IllegalArgumentException("port \"" + id + "\" is not a flowing state of unit \""
                            + unitId + "\"");
                }
                sign.merge(j, side == 0 ? 1.0 : -1.0, Double::sum);
            }
        }
        sign.values().removeIf(v -> v == 0.0);
        int[] js = sign.keySet().stream().mapToInt(Integer::intValue).toArray();
        double[] ss = sign.values().stream().mapToDouble(Double::doubleValue).toArray();
        return new Object[] {js, ss};
    }

    private static void addRow(List<Integer> kinds, List<int[]> states, List<double[]> signs, List<int[]> inputs,
                               List<Double> pressures, List<String> labels, int kind, Object[] ports, int[] in,
                               double pressure, String label) {
        kinds.add(kind);
        states.add((int[]) ports[0]);
        signs.add((double[]) ports[1]);
        inputs.add(in);
        pressures.add(pressure);
        labels.add(label);
    }

    /** The measured and declared quantities, in the order of {@link ReconciliationResult#sensors()}. */
    public List<String> quantityIds() {
        List<String> ids = new ArrayList<>();
        for (int i = 0; i < sensorCount; i++) {
            if (inModel[i]) {
                ids.add(sensors[i].id());
            }
        }
        for (int k = 0; k < constantId.length; k++) {
            if (constantSigma[k] > 0.0) {
                ids.add(constantId[k]);
            }
        }
        return ids;
    }

    /**
     * The balances a measured or declared quantity takes part in, by the names the reconciliation
     * uses for them elsewhere (e.g. "mass balance of hp_heater", "energy balance of deaerator",
     * "check flow FT-421 on feedwater", "energy balance of condenser+cooling_water",
     * "energy balance of hp_turbine+lp_turbine+generator"), in the order the balances are built:
     * per component in the unit's order its mass and adiabatic energy balances, then the check-flow
     * meters, then the duplicate transmitters ("same measurand PT-101 = PT-101B"), then the balances
     * against an independent measurement (generator, cooling water, motor, fuel).
     *
     * <p>This is the structure of the unit's balances, worked out once by {@link #compile}: it does
     * not depend on a snapshot. Whether the sensor is redundant in a given snapshot (and so can be
     * checked at all) depends on which other sensors have usable values; the
     * {@link ReconciledSensor#redundancy()} of a result says that.
     *
     * @param quantityId a sensor id, or a declared constant's id such as {@code generator.efficiency}
     * @return the balances, or an empty list when the quantity enters none (e.g. the pressure of a
     *         state whose enthalpy is fixed by an energy balance, or a sensor the balances do not
     *         use) or is not a quantity of this unit; never null. Safe to call from any thread.
     */
    public List<String> balancesOf(String quantityId) {
        return balancesByQuantity.getOrDefault(quantityId, List.of());
    }

    // ================================================================ one snapshot

    /**
     * Reconciles one snapshot and, when its global test fails, identifies the suspects.
     *
     * @throws IllegalArgumentException if the snapshot is for another unit or has another number of
     *                                  sensors (a wiring error, not a bad value)
     */
    public Reconciliation reconcile(Snapshot snapshot) {
        return reconcileWith(snapshot, declaredSigma);
    }

    /**
     * Reconciles one snapshot as {@link #reconcile(Snapshot)} does, with the given sensor
     * uncertainties in place of the declared ones (e.g. those of a mean of n readings, u/√n): the
     * weights, tests, χ² and reconciled uncertainties are those a reconciliation compiled from the
     * unit with these uncertainties would give. Nothing the compilation prepares depends on the
     * sensors' uncertainties, so no compilation is needed. The declared constants keep theirs.
     *
     * @param standardUncertaintySi one standard uncertainty per sensor, SI, in declaration order,
     *                              each positive and finite (see {@link SensorUncertainties})
     * @throws IllegalArgumentException as {@link #reconcile(Snapshot)}, and when the uncertainties
     *                                  are not one positive finite value per sensor
     */
    public Reconciliation reconcile(Snapshot snapshot, double[] standardUncertaintySi) {
        SensorUncertainties.check(unitId, sensors, standardUncertaintySi);
        double[] sigma = workspace.givenSigma;
        System.arraycopy(standardUncertaintySi, 0, sigma, 0, sensorCount);
        System.arraycopy(constantSigma, 0, sigma, sensorCount, constantSigma.length);
        return reconcileWith(snapshot, sigma);
    }

    /** Per input, the standard uncertainty: the sensors' as given, then the declared constants'. */
    private double[] inputSigma(double[] sensorSigma) {
        double[] sigma = Arrays.copyOf(sensorSigma, inputCount);
        System.arraycopy(constantSigma, 0, sigma, sensorCount, constantSigma.length);
        return sigma;
    }

    private Reconciliation reconcileWith(Snapshot snapshot, double[] sigma) {
        if (!snapshot.unitId().equals(unitId)) {
            throw new IllegalArgumentException("snapshot of unit \"" + snapshot.unitId()
                    + "\" given to the reconciliation of unit \"" + unitId + "\"");
        }
        if (snapshot.valuesSi().length != sensorCount) {
            throw new IllegalArgumentException("snapshot of unit \"" + unitId + "\" has " + snapshot.valuesSi().length
                    + " values; the unit has " + sensorCount + " sensors");
        }
        double[] measured = workspace.measured;
        boolean[] usable = workspace.usable;
        for (int i = 0; i < sensorCount; i++) {
            double v = snapshot.valuesSi()[i];
            measured[i] = v;
            usable[i] = inModel[i] && snapshot.status()[i] == Snapshot.SensorStatus.GOOD && Double.isFinite(v)
                    && sensors[i].isPlausible(v);
        }
        for (int k = 0; k < constantId.length; k++) {
            measured[sensorCount + k] = constantValue[k];
            usable[sensorCount + k] = true;
        }
        boolean[] removed = workspace.removed;
        Arrays.fill(removed, false);
        Solution base = solve(measured, usable, removed, null, sigma);

        List<Suspect> suspects = new ArrayList<>();
        boolean[] suspect = workspace.suspect;
        Arrays.fill(suspect, false);
        double[] excludingSuspects = null;
        Solution current = base;
        if (base.status.equals(ReconciliationResult.FAILED)) {
            List<Integer> named = new ArrayList<>();
            for (int step = 1; step <= MAX_SUSPECTS; step++) {
                int candidate = current.largestTest(removed, testLimit);
                if (candidate < 0) {
                    break;
                }
                List<Integer> set = new ArrayList<>(current.equivalents(candidate));
                candidate = set.get(0);
                removed[candidate] = true;
                Solution next = solve(measured, usable, removed, base, sigma);
                // The balances cannot order the members of a set to first order, but a gross error
                // that takes a state out of its region can: removing the wrong member then leaves
                // a fit that does not converge or fits far worse. Name the member whose removal fits
                // the rest best; between near-equal fits keep the order of plausibility above.
                for (int k = 1; k < set.size(); k++) {
                    int other = set.get(k);
                    removed[candidate] = false;
                    removed[other] = true;
                    Solution alternative = solve(measured, usable, removed, base, sigma);
                    if (fitsBetter(alternative, next)) {
                        candidate = other;
                        giveBack(next);
                        next = alternative;
                    } else {
                        removed[other] = false;
                        removed[candidate] = true;
                        giveBack(alternative);
                    }
                }
                set.remove(Integer.valueOf(candidate));
                set.add(0, candidate);
                OptionalDouble bias = OptionalDouble.empty();
                OptionalDouble sigmaBias = OptionalDouble.empty();
                if (next.converged && next.observable(candidate)) {
                    bias = OptionalDouble.of(measured[candidate] - next.value[candidate]);
                    double s = next.unknownSigma(candidate);
                    sigmaBias = OptionalDouble.of(Math.sqrt(sigma[candidate] * sigma[candidate] + s * s));
                }
                boolean confirmed = next.status.equals(ReconciliationResult.PASSED);
                List<String> ids = new ArrayList<>();
                for (int q : set) {
                    ids.add(inputId(q));
                    suspect[q] = true;
                }
                suspects.add(new Suspect(step, inputId(candidate), inputUnit(candidate), ids, current.test[candidate], bias, sigmaBias,
                        confirmed));
                named.add(candidate);
                if (current != base) {
                    giveBack(current);
                }
                current = next;
                if (confirmed || !next.converged) {
                    if (confirmed) {
                        boolean everyOneEstimated = true;
                        for (Suspect s : suspects) {
                            everyOneEstimated &= s.bias().isPresent();
                        }
                        if (everyOneEstimated) {
                            excludingSuspects = snapshot.valuesSi().clone();
                            for (int q : named) {
                                if (q < sensorCount) {
                                    excludingSuspects[q] = next.value[q];
                                }
                            }
                        }
                    }
                    break;
                }
            }
        }

        double[] reconciled = null;
        if (base.converged) {
            reconciled = snapshot.valuesSi().clone();
            for (int i = 0; i < sensorCount; i++) {
                if (base.role[i] == MEASURED) {
                    reconciled[i] = base.value[i];
                }
            }
        }
        Reconciliation out = new Reconciliation(result(base, measured, usable, suspect, suspects),
                base.status.equals(ReconciliationResult.PASSED) ? reconciled : null, excludingSuspects);
        if (current != base) {
            giveBack(current);
        }
        giveBack(base);
        return out;
    }

    /** A solution cleared for a reconciliation with these uncertainties: one given back earlier, or a new one. */
    private Solution takeSolution(double[] sigma) {
        Solution s = spareSolutions.pollFirst();
        if (s == null) {
            s = new Solution(inputCount + 2 * stateCount);
        }
        s.clear(sigma);
        return s;
    }

    /** For a solution nothing refers to any more: the next {@link #takeSolution} may hand it out again. */
    private void giveBack(Solution s) {
        spareSolutions.addFirst(s);
    }

    /** A converged fit beats one that did not converge; between converged ones, a χ² lower by more than 0.1. */
    private static boolean fitsBetter(Solution a, Solution b) {
        if (a.converged != b.converged) {
            return a.converged;
        }
        return a.converged && a.chi2 < b.chi2 - 0.1;
    }

    private String inputId(int q) {
        return q < sensorCount ? sensors[q].id() : constantId[q - sensorCount];
    }

    private String inputUnit(int q) {
        if (q < sensorCount) {
            return sensors[q].quantity().siUnit();
        }
        return constantId[q - sensorCount].endsWith(".heating_value") ? "J/kg" : "1";
    }

    private ReconciliationResult result(Solution s, double[] measured, boolean[] usable, boolean[] suspect,
                                        List<Suspect> suspects) {
        // sized for every input at once: the record copies the list, so growing it would be garbage twice
        List<ReconciledSensor> list = new ArrayList<>(inputCount);
        for (int q = 0; q < inputCount; q++) {
            boolean isSensor = q < sensorCount;
            if (isSensor ? !inModel[q] : constantSigma[q - sensorCount] == 0.0) {
                continue;
            }
            OptionalDouble u = OptionalDouble.of(s.sigma[q]);
            if (!usable[q]) {
                list.add(new ReconciledSensor(inputId(q), "sensor", inputUnit(q), OptionalDouble.empty(), u,
                        OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(), "excluded", false));
                continue;
            }
            boolean redundant = s.converged && s.projection[q] > REDUNDANT_TOLERANCE;
            list.add(new ReconciledSensor(inputId(q), isSensor ? "sensor" : "constant", inputUnit(q),
                    OptionalDouble.of(measured[q]), u,
                    s.converged ? OptionalDouble.of(s.value[q]) : OptionalDouble.empty(),
                    s.converged ? OptionalDouble.of(s.sigma[q] * Math.sqrt(Math.max(0.0, 1.0 - s.projection[q])))
                            : OptionalDouble.empty(),
                    redundant ? OptionalDouble.of(s.test[q]) : OptionalDouble.empty(),
                    redundant ? "redundant" : "just_determined", suspect[q]));
        }
        List<ReconciledQuantity> unmeasured = new ArrayList<>(s.nu);
        for (int z = 0; z < s.role.length; z++) {
            if (s.role[z] != UNKNOWN || z < inputCount) {
                continue;
            }
            boolean flow = z < inputCount + stateCount;
            int j = flow ? z - inputCount : z - inputCount - stateCount;
            String id = flow ? flowQuantityId[j] : enthalpyQuantityId[j];
            boolean observable = s.converged && s.observable(z);
            unmeasured.add(new ReconciledQuantity(id, flow ? "kg/s" : "J/kg",
                    observable ? OptionalDouble.of(s.value[z]) : OptionalDouble.empty(),
                    observable ? OptionalDouble.of(s.unknownSigma(z)) : OptionalDouble.empty(), observable));
        }
        OptionalDouble limit = s.redundancy > 0 ? OptionalDouble.of(chi2Limit[s.redundancy]) : OptionalDouble.empty();
        return new ReconciliationResult(s.status, s.converged ? s.chi2 : 0.0, limit, s.redundancy, CONFIDENCE,
                testLimit, s.iterations, Optional.ofNullable(s.reason), list, unmeasured, suspects);
    }

    // ================================================================ the solve

    /**
     * One reconciliation with a given set of usable and removed inputs. Its arrays have room for
     * every variable of the unit; {@code measured} and {@code unknown} are used up to {@code nm} and
     * {@code nu}, {@code basis} up to nm rows of {@code redundancy} entries. Taken from
     * {@link #spareSolutions} and given back when the snapshot is done, so {@link #clear} must leave it
     * as a new one would be.
     */
    private final class Solution {
        final int[] role;
        final double[] value;
        final int[] flowVar;
        final boolean[] activeRow;
        /** Per input, the standard uncertainty this reconciliation weights and tests with. */
        double[] sigma;
        final int[] measuredAt;
        final int[] unknownAt;
        final int[] measured;
        final int[] unknown;
        int nm;
        int nu;
        boolean converged;
        int iterations;
        String reason;
        String status = ReconciliationResult.NOT_RUN;
        double chi2;
        int redundancy;
        /** P_ii per z index (inputs), 0 elsewhere. */
        final double[] projection;
        final double[] test;
        /** Orthonormal basis of the row space of G, one row per measured quantity; see {@link #basis(int, int)}. */
        double[][] basis = new double[0][0];
        final boolean[] observableUnknown;
        final double[] sigmaUnknown;

        Solution(int size) {
            role = new int[size];
            value = new double[size];
            flowVar = new int[stateCount];
            activeRow = new boolean[rowCount];
            measuredAt = new int[size];
            unknownAt = new int[size];
            measured = new int[inputCount];
            unknown = new int[size];
            projection = new double[size];
            test = new double[size];
            observableUnknown = new boolean[size];
            sigmaUnknown = new double[size];
        }

        /**
         * As new, for a reconciliation with these uncertainties. The arrays that {@link #solve} sets
         * in full before reading ({@code flowVar}, {@code activeRow}, {@code measuredAt},
         * {@code unknownAt}, {@code measured}, {@code unknown}) and the basis, which is read only
         * after {@link #statistics} has set it, are left as they are.
         */
        void clear(double[] sigma) {
            this.sigma = sigma;
            Arrays.fill(role, UNUSED);
            Arrays.fill(value, 0.0);
            Arrays.fill(projection, 0.0);
            Arrays.fill(test, 0.0);
            Arrays.fill(observableUnknown, false);
            Arrays.fill(sigmaUnknown, 0.0);
            nm = 0;
            nu = 0;
            converged = false;
            iterations = 0;
            reason = null;
            status = ReconciliationResult.NOT_RUN;
            chi2 = 0.0;
            redundancy = 0;
        }

        /** Makes room in {@link #basis} for {@code rows} rows of {@code cols} entries. */
        void basis(int rows, int cols) {
            if (basis.length < rows || (rows > 0 && basis[0].length < cols)) {
                basis = new double[Math.max(rows, basis.length)][Math.max(cols, basis.length == 0 ? 0
                        : basis[0].length)];
            }
        }

        boolean observable(int z) {
            int u = unknownAt[z];
            return u >= 0 && observableUnknown[u];
        }

        double unknownSigma(int z) {
            return sigmaUnknown[unknownAt[z]];
        }

        int largestTest(boolean[] removed, double limit) {
            int best = -1;
            double bestValue = limit;
            for (int q = 0; q < inputCount; q++) {
                if (role[q] == MEASURED && !removed[q] && projection[q] > REDUNDANT_TOLERANCE && test[q] > bestValue) {
                    best = q;
                    bestValue = test[q];
                }
            }
            return best;
        }

        List<Integer> equivalents(int q) {
            List<Integer> set = new ArrayList<>();
            set.add(q);
            double[] a = basis[measuredAt[q]];
            for (int m = 0; m < nm; m++) {
                int other = measured[m];
                if (other == q || projection[other] <= REDUNDANT_TOLERANCE) {
                    continue;
                }
                double[] b = basis[measuredAt[other]];
                double pqo = 0.0;
                for (int k = 0; k < redundancy; k++) {
                    pqo += a[k] * b[k];
                }
                double rho = pqo / Math.sqrt(projection[q] * projection[other]);
                boolean pair = q < sensorCount && other < sensorCount && measurandOf[q] == measurandOf[other];
                if (Math.abs(rho) >= (pair ? PAIR_EQUIVALENCE_CORRELATION : EQUIVALENCE_CORRELATION)) {
                    set.add(other);
                }
            }
            // Most plausible first: the gross error each member would need, |v| / (u P_ii), in its own
            // standard uncertainties; the balances alone cannot order them.
            set.sort(Comparator.comparingDouble(m -> Math.abs(test[m]) / Math.sqrt(projection[m])));
            return set;
        }
    }

    /**
     * One reconciliation with the quantities {@code removed} made unmeasured.
     *
     * @param start a converged fit of the same snapshot whose estimates the unknowns start from (a
     *              serial-elimination re-solve starts next to the answer and needs fewer
     *              linearisations); null to start from the measured values and plain guesses
     * @param sigma per input, the standard uncertainty to weight and test with
     */
    private Solution solve(double[] measuredValues, boolean[] usable, boolean[] removed, Solution start,
                           double[] sigma) {
        int size = inputCount + 2 * stateCount;
        Solution s = takeSolution(sigma);
        for (int q = 0; q < inputCount; q++) {
            s.value[q] = measuredValues[q];
            if (q >= sensorCount && constantSigma[q - sensorCount] == 0.0) {
                s.role[q] = FIXED;
            } else if (!usable[q]) {
                s.role[q] = UNUSED;
            } else {
                s.role[q] = removed[q] ? UNKNOWN : MEASURED;
            }
        }
        double flowGuess = 0.0;
        int metered = 0;
        for (int j = 0; j < stateCount; j++) {
            int fs = flowSensor[j];
            if (fs >= 0 && s.role[fs] != UNUSED) {
                s.flowVar[j] = fs;
                flowGuess += measuredValues[fs];
                metered++;
            } else {
                s.flowVar[j] = inputCount + j;
                s.role[inputCount + j] = UNKNOWN;
            }
        }
        flowGuess = metered > 0 ? flowGuess / metered : 100.0;
        Enthalpy e = workspace.enthalpy;
        for (int j = 0; j < stateCount; j++) {
            s.value[inputCount + j] = flowGuess;
            if (!hasEnthalpyFunction(s, j) || !hasIf97State(e, j, measuredValues)) {
                int z = inputCount + stateCount + j;
                s.role[z] = UNKNOWN;
                s.value[z] = enthalpyGuess(e, j, measuredValues);
            }
        }
        if (start != null && start.converged) {
            for (int z = 0; z < size; z++) {
                boolean estimatedThere = start.role[z] == MEASURED || start.role[z] == UNKNOWN;
                if (s.role[z] == UNKNOWN && estimatedThere && Double.isFinite(start.value[z])) {
                    s.value[z] = start.value[z];
                }
            }
        }
        for (int r = 0; r < rowCount; r++) {
            boolean active = true;
            for (int q : rowInputs[r]) {
                active &= s.role[q] != UNUSED;
            }
            s.activeRow[r] = active;
        }
        int nm = 0;
        int nu = 0;
        Arrays.fill(s.measuredAt, -1);
        Arrays.fill(s.unknownAt, -1);
        for (int z = 0; z < size; z++) {
            if (s.role[z] == MEASURED) {
                s.measuredAt[z] = nm++;
            } else if (s.role[z] == UNKNOWN) {
                s.unknownAt[z] = nu++;
            }
        }
        s.nm = nm;
        s.nu = nu;
        for (int z = 0; z < size; z++) {
            if (s.measuredAt[z] >= 0) {
                s.measured[s.measuredAt[z]] = z;
            }
            if (s.unknownAt[z] >= 0) {
                s.unknown[s.unknownAt[z]] = z;
            }
        }
        int nc = 0;
        for (int r = 0; r < rowCount; r++) {
            nc += s.activeRow[r] ? 1 : 0;
        }
        try {
            iterate(s, measuredValues, nc, nm, nu, e);
        } catch (IllegalStateException | IllegalArgumentException ex) {
            s.converged = false;
            s.status = ReconciliationResult.NOT_CONVERGED;
            s.reason = "no IF97 state at an intermediate estimate: " + ex.getMessage();
        }
        return s;
    }

    private boolean hasEnthalpyFunction(Solution s, int j) {
        return switch (hMode[j]) {
            case H_PT -> s.role[pSensor[j]] != UNUSED && s.role[tSensor[j]] != UNUSED;
            case H_PX -> s.role[pSensor[j]] != UNUSED;
            default -> false;
        };
    }

    /**
     * Whether the measured values give the state an IF97 enthalpy; one that does not (a value
     * outside the formulation, though within the sensor's plausible range) makes it unmeasured, like
     * a stale sensor, instead of stopping the reconciliation.
     */
    private boolean hasIf97State(Enthalpy e, int j, double[] values) {
        try {
            if (hMode[j] == H_PT) {
                e.pt(values[pSensor[j]], values[tSensor[j]]);
            } else {
                e.px(values[pSensor[j]], quality[j]);
            }
            return Double.isFinite(e.h) && Double.isFinite(e.dhdp) && Double.isFinite(e.dhdT);
        } catch (IllegalArgumentException | IllegalStateException ex) {
            return false;
        }
    }

    /** A start for an unknown enthalpy: from the raw values where they exist, else a wet state at x = 0.9. */
    private double enthalpyGuess(Enthalpy e, int j, double[] values) {
        double p = values[pSensor[j]];
        try {
            if (hMode[j] == H_PT && Double.isFinite(values[tSensor[j]])) {
                e.pt(p, values[tSensor[j]]);
                return e.h;
            }
            if (hMode[j] == H_PX) {
                e.px(p, quality[j]);
                return e.h;
            }
            e.px(p, 0.9);
            return e.h;
        } catch (RuntimeException ex) {
            return 2.0e6;
        }
    }

    /** Balances and their Jacobian, by z index, at the solution's current values. */
    private void evaluate(Solution s, double[] f, double[][] jac, Enthalpy e, double[] h, double[] dhdp,
                          double[] dhdT) {
        for (int j = 0; j < stateCount; j++) {
            int z = inputCount + stateCount + j;
            if (s.role[z] == UNKNOWN) {
                h[j] = s.value[z];
                continue;
            }
            if (hMode[j] == H_PT) {
                e.pt(s.value[pSensor[j]], s.value[tSensor[j]]);
            } else {
                e.px(s.value[pSensor[j]], quality[j]);
            }
            h[j] = e.h;
            dhdp[j] = e.dhdp;
            dhdT[j] = e.dhdT;
        }
        int row = 0;
        for (int r = 0; r < rowCount; r++) {
            if (!s.activeRow[r]) {
                continue;
            }
            double[] d = jac[row];
            Arrays.fill(d, 0.0);
            double sum = 0.0;
            int[] js = rowStates[r];
            double[] sg = rowSigns[r];
            if (rowKind[r] == ROW_SAME) {
                int p = rowInputs[r][0];
                int q = rowInputs[r][1];
                double scale = 1.0 / Math.hypot(s.sigma[p], s.sigma[q]);
                d[p] += scale;
                d[q] -= scale;
                f[row++] = scale * (s.value[p] - s.value[q]);
                continue;
            }
            if (rowKind[r] == ROW_MASS || rowKind[r] == ROW_METER) {
                for (int k = 0; k < js.length; k++) {
                    int j = js[k];
                    sum += sg[k] * s.value[s.flowVar[j]];
                    d[s.flowVar[j]] += sg[k];
                }
                if (rowKind[r] == ROW_METER) {
                    int q = rowInputs[r][0];
                    sum -= s.value[q];
                    d[q] -= 1.0;
                }
                f[row++] = sum;
                continue;
            }
            // Σ_in m h − Σ_out m h, in MW: for the components of an independent measurement this is
            // minus their steam side S = Σ_out m h − Σ_in m h.
            for (int k = 0; k < js.length; k++) {
                int j = js[k];
                double m = s.value[s.flowVar[j]];
                double c = sg[k] * ENERGY_SCALE;
                sum += c * m * h[j];
                d[s.flowVar[j]] += c * h[j];
                addEnthalpy(s, d, j, c * m, dhdp, dhdT);
            }
            int[] in = rowInputs[r];
            switch (rowKind[r]) {
                case ROW_GENERATOR -> {
                    // turbine work W = −S = P / η
                    double p = s.value[in[0]];
                    double eta = s.value[in[1]];
                    sum -= ENERGY_SCALE * p / eta;
                    d[in[0]] -= ENERGY_SCALE / eta;
                    d[in[1]] += ENERGY_SCALE * p / (eta * eta);
                }
                case ROW_COOLING_WATER -> {
                    // heat rejected −S = m_cw (h_out − h_in)
                    double m = s.value[in[0]];
                    e.pt(rowPressure[r], s.value[in[1]]);
                    double hIn = e.h;
                    double cpIn = e.dhdT;
                    e.pt(rowPressure[r], s.value[in[2]]);
                    double hOut = e.h;
                    double cpOut = e.dhdT;
                    sum -= ENERGY_SCALE * m * (hOut - hIn);
                    d[in[0]] -= ENERGY_SCALE * (hOut - hIn);
                    d[in[1]] += ENERGY_SCALE * m * cpIn;
                    d[in[2]] -= ENERGY_SCALE * m * cpOut;
                }
                case ROW_MOTOR -> {
                    // pump work on the fluid S = η P, so Σ_in − Σ_out = −η P: add η P
                    double p = s.value[in[0]];
                    double eta = s.value[in[1]];
                    sum += ENERGY_SCALE * eta * p;
                    d[in[0]] += ENERGY_SCALE * eta;
                    d[in[1]] += ENERGY_SCALE * p;
                }
                case ROW_FUEL -> {
                    double m = s.value[in[0]];
                    double hv = s.value[in[1]];
                    double eta = s.value[in[2]];
                    sum += ENERGY_SCALE * m * hv * eta;
                    d[in[0]] += ENERGY_SCALE * hv * eta;
                    d[in[1]] += ENERGY_SCALE * m * eta;
                    d[in[2]] += ENERGY_SCALE * m * hv;
                }
                default -> {
                    // adiabatic: nothing crosses the boundary
                }
            }
            f[row++] = sum;
        }
    }

    private void addEnthalpy(Solution s, double[] d, int j, double c, double[] dhdp, double[] dhdT) {
        int z = inputCount + stateCount + j;
        if (s.role[z] == UNKNOWN) {
            d[z] += c;
        } else {
            d[pSensor[j]] += c * dhdp[j];
            if (hMode[j] == H_PT) {
                d[tSensor[j]] += c * dhdT[j];
            }
        }
    }

    private void iterate(Solution s, double[] xm, int nc, int nm, int nu, Enthalpy e) {
        ReconcilerWorkspace w = workspace;
        double[] f = w.f;
        double[][] jac = w.jac;
        double[] h = w.h;
        double[] dhdp = w.dhdp;
        double[] dhdT = w.dhdT;
        double[] sigma = w.sigma;
        for (int a = 0; a < nm; a++) {
            sigma[a] = s.sigma[s.measured[a]];
        }
        double[] colScale = w.colScale;
        double[][] bColumns = w.bColumns(nu);
        double[][] aHat = w.aHat;
        double[] r = w.r;
        double[] adjust = w.adjust;
        if (nc == 0) {
            s.converged = true;
            s.status = ReconciliationResult.NO_REDUNDANCY;
            s.iterations = 0;
            s.basis(nm, 0);
            markObservability(s, null, nu);
            return;
        }
        double lastStep = Double.POSITIVE_INFINITY;
        double residual = Double.POSITIVE_INFINITY;
        int worst = 0;
        for (int it = 1; it <= MAX_ITERATIONS; it++) {
            s.iterations = it;
            evaluate(s, f, jac, e, h, dhdp, dhdT);
            residual = 0.0;
            for (int i = 0; i < nc; i++) {
                if (Math.abs(f[i]) > residual) {
                    residual = Math.abs(f[i]);
                    worst = i;
                }
            }
            for (int u = 0; u < nu; u++) {
                double n2 = 0.0;
                for (int i = 0; i < nc; i++) {
                    double v = jac[i][s.unknown[u]];
                    n2 += v * v;
                }
                colScale[u] = n2 > 0.0 ? 1.0 / Math.sqrt(n2) : 1.0;
            }
            int[] measured = s.measured;
            int[] unknown = s.unknown;
            for (int a = 0; a < nm; a++) {
                int z = measured[a];
                adjust[a] = xm[z] - s.value[z];
            }
            for (int i = 0; i < nc; i++) {
                double[] ji = jac[i];
                double[] ai = aHat[i];
                double ri = f[i];
                for (int a = 0; a < nm; a++) {
                    double coef = ji[measured[a]];
                    ai[a] = coef * sigma[a];
                    ri += coef * adjust[a];
                }
                r[i] = ri;
                for (int u = 0; u < nu; u++) {
                    bColumns[u][i] = ji[unknown[u]] * colScale[u];
                }
            }
            // Q is orthogonal, so the balances of G = Q₂ᵀ Â are of the order of the longest row of Â at most.
            double rowScale = 0.0;
            for (int i = 0; i < nc; i++) {
                double n2 = 0.0;
                for (int a = 0; a < nm; a++) {
                    n2 += aHat[i][a] * aHat[i][a];
                }
                rowScale = Math.max(rowScale, Math.sqrt(n2));
            }
            PivotedQr qb = w.qb;
            qb.factorColumns(bColumns, nc, nu, RANK_TOLERANCE, 0.0);
            int rb = qb.rank;
            double[] qr = w.qtr;
            System.arraycopy(r, 0, qr, 0, nc);
            qb.applyQt(qr);
            int nr = nc - rb;
            // Gᵀ = Âᵀ Q₂, one column per remaining balance, from the columns of Q₂ (Q applied to unit
            // vectors): far fewer operations than Qᵀ Â in full, which only the last step needs.
            // by columns (one per remaining balance), the layout PivotedQr factors in
            double[][] gt = w.gt;
            double[] q2 = w.qColumn;
            for (int k = 0; k < nr; k++) {
                Arrays.fill(gt[k], 0, nm, 0.0);
                Arrays.fill(q2, 0, nc, 0.0);
                q2[rb + k] = 1.0;
                qb.applyQ(q2);
                for (int i = 0; i < nc; i++) {
                    double qi = q2[i];
                    if (qi != 0.0) {
                        double[] row = aHat[i];
                        double[] g = gt[k];
                        for (int a = 0; a < nm; a++) {
                            g[a] += qi * row[a];
                        }
                    }
                }
            }
            double[] ev = w.ev;
            int red = 0;
            PivotedQr qg = null;
            if (nr > 0 && nm > 0) {
                qg = w.qg;
                qg.factorColumns(gt, nm, nr, RANK_TOLERANCE, rowScale);
                red = qg.rank;
                for (int k = 0; k < red; k++) {
                    ev[k] = -qr[rb + qg.perm[k]];
                }
                qg.solveUpperTransposed(ev);
                Arrays.fill(ev, red, nm, 0.0);
                qg.applyQ(ev);
            } else {
                Arrays.fill(ev, 0, nm, 0.0);
            }
            // Δy of the rows that fix the unknowns: R11 u = −Q₁ᵀ (r + Â e)
            double[] t = w.t;
            for (int i = 0; i < nc; i++) {
                double v = r[i];
                double[] row = aHat[i];
                for (int a = 0; a < nm; a++) {
                    v += row[a] * ev[a];
                }
                t[i] = v;
            }
            qb.applyQt(t);
            for (int k = 0; k < rb; k++) {
                t[k] = -t[k];
            }
            if (rb > 0) {
                qb.solveUpper(t);
            }
            double step = 0.0;
            for (int a = 0; a < nm; a++) {
                int z = s.measured[a];
                double next = xm[z] + sigma[a] * ev[a];
                step = Math.max(step, Math.abs(next - s.value[z]) / sigma[a]);
                s.value[z] = next;
            }
            for (int k = 0; k < rb; k++) {
                int u = qb.perm[k];
                s.value[s.unknown[u]] += colScale[u] * t[k];
            }
            lastStep = step;
            boolean settled = step <= STEP_TOLERANCE && residual <= RESIDUAL_TOLERANCE;
            if (settled) {
                s.converged = true;
                s.redundancy = red;
                statistics(s, ev, qg, red, nm);
                // Q₁ᵀ Â from the rb columns of Q₁, as Gᵀ above: rows of Â combined contiguously instead
                // of Qᵀ applied to each of the nm columns of Â
                double[][] q1a = w.q1a;
                double[] q1 = w.qColumn;
                for (int k = 0; k < rb; k++) {
                    Arrays.fill(q1, 0, nc, 0.0);
                    q1[k] = 1.0;
                    qb.applyQ(q1, k);
                    double[] out = q1a[k];
                    Arrays.fill(out, 0, nm, 0.0);
                    for (int i = 0; i < nc; i++) {
                        double qi = q1[i];
                        if (qi != 0.0) {
                            double[] row = aHat[i];
                            for (int a = 0; a < nm; a++) {
                                out[a] += qi * row[a];
                            }
                        }
                    }
                }
                unknownStatistics(s, qb, q1a, colScale, nm, nu);
                double chi2 = 0.0;
                for (int a = 0; a < nm; a++) {
                    chi2 += ev[a] * ev[a];
                }
                s.chi2 = chi2;
                if (red == 0) {
                    s.status = ReconciliationResult.NO_REDUNDANCY;
                } else {
                    s.status = chi2 <= chi2Limit[red] ? ReconciliationResult.PASSED : ReconciliationResult.FAILED;
                }
                return;
            }
        }
        s.converged = false;
        s.status = ReconciliationResult.NOT_CONVERGED;
        s.reason = "no convergence in " + MAX_ITERATIONS + " linearisations: largest residual " + residual
                + " (kg/s, or MW for an energy balance) in the " + activeLabel(s, worst) + ", last step " + lastStep
                + " standard uncertainties";
    }

    private String activeLabel(Solution s, int active) {
        int seen = 0;
        for (int r = 0; r < rowCount; r++) {
            if (s.activeRow[r] && seen++ == active) {
                return rowLabel[r];
            }
        }
        return "balances";
    }

    private void statistics(Solution s, double[] ev, PivotedQr qg, int red, int nm) {
        s.basis(nm, red);
        if (qg != null) {
            double[] col = workspace.basisColumn;
            for (int k = 0; k < red; k++) {
                Arrays.fill(col, 0, nm, 0.0);
                col[k] = 1.0;
                qg.applyQ(col, k);
                for (int a = 0; a < nm; a++) {
                    s.basis[a][k] = col[a];
                }
            }
        }
        for (int a = 0; a < nm; a++) {
            int z = s.measured[a];
            double p = 0.0;
            for (int k = 0; k < red; k++) {
                p += s.basis[a][k] * s.basis[a][k];
            }
            p = Math.min(1.0, p);
            s.projection[z] = p;
            s.test[z] = p > REDUNDANT_TOLERANCE ? Math.abs(ev[a]) / Math.sqrt(p) : 0.0;
        }
    }

    /**
     * Observability of each unknown from the null space of B, and u(ŷ) of the observable ones from
     * ŷ − y = −K (x̂ − x) with K = R₁₁⁻¹ Q₁ᵀ Â and cov(x̂) = S^{1/2} (I − P) S^{1/2}.
     *
     * @param q1a Q₁ᵀ Â by rows: {@code q1a[i][a]} is column i of Q (i below the rank of B) times
     *            column a of Â; overwritten by K
     */
    private void unknownStatistics(Solution s, PivotedQr qb, double[][] q1a, double[] colScale, int nm, int nu) {
        int rb = qb.rank;
        markObservability(s, qb, nu);
        double[] k = workspace.kColumn;
        // K column by column in place of Q₁ᵀ Â: column a is read whole before it is written
        double[][] kRows = q1a;
        for (int a = 0; a < nm; a++) {
            for (int i = 0; i < rb; i++) {
                k[i] = q1a[i][a];
            }
            qb.solveUpper(k);
            for (int i = 0; i < rb; i++) {
                kRows[i][a] = k[i];
            }
        }
        int red = s.redundancy;
        double[] dots = workspace.dots;
        for (int i = 0; i < rb; i++) {
            int u = qb.perm[i];
            if (!s.observableUnknown[u]) {
                continue;
            }
            double total = 0.0;
            for (int a = 0; a < nm; a++) {
                total += kRows[i][a] * kRows[i][a];
            }
            // basis is held by rows: accumulate all red dot products in one pass over a
            Arrays.fill(dots, 0, red, 0.0);
            double[] ki = kRows[i];
            for (int a = 0; a < nm; a++) {
                double ka = ki[a];
                double[] basisRow = s.basis[a];
                for (int c = 0; c < red; c++) {
                    dots[c] += ka * basisRow[c];
                }
            }
            double projected = 0.0;
            for (int c = 0; c < red; c++) {
                projected += dots[c] * dots[c];
            }
            s.sigmaUnknown[u] = colScale[u] * Math.sqrt(Math.max(0.0, total - projected));
        }
    }

    private void markObservability(Solution s, PivotedQr qb, int nu) {
        if (qb == null) {
            return;
        }
        int rb = qb.rank;
        int free = nu - rb;
        // N = R11⁻¹ R12: a pivot unknown coupled to a free one is not determined either. One column
        // of N at a time; the coupling of pivot i is the "or" over the columns, in any order.
        boolean[] coupled = workspace.coupled;
        Arrays.fill(coupled, 0, rb, false);
        double[] col = workspace.nullColumn;
        for (int c = 0; c < free; c++) {
            for (int i = 0; i < rb; i++) {
                col[i] = qb.r(i, rb + c);
            }
            qb.solveUpper(col);
            for (int i = 0; i < rb; i++) {
                coupled[i] |= Math.abs(col[i]) > NULL_SPACE_TOLERANCE;
            }
        }
        for (int i = 0; i < rb; i++) {
            s.observableUnknown[qb.perm[i]] = !coupled[i];
        }
    }
}
