package org.steamtally.calc.plant;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.SplittableRandom;
import java.util.function.Predicate;

import org.steamtally.calc.plant.Component.ClosedFeedwaterHeater;
import org.steamtally.calc.plant.Component.Condenser;
import org.steamtally.calc.plant.Component.Generator;
import org.steamtally.calc.plant.Component.Mixer;
import org.steamtally.calc.plant.Component.OpenFeedwaterHeater;
import org.steamtally.calc.plant.Component.Pump;
import org.steamtally.calc.plant.Component.SteamGenerator;
import org.steamtally.calc.plant.Component.TurbineSection;
import org.steamtally.calc.plant.PlantProblem.Kind;

/**
 * The structural checks of a plant description, which need no file positions: unique ids, names
 * that resolve to the right sort of thing, sensors of the right quantity, every flowing state leaving
 * exactly one component and entering exactly one, state fixes backed by the measurement they rely on,
 * and flows that the measured flows determine.
 *
 * <p>Problems carry a path in the plant description's own key names ({@code units[0].components[3].drain_outlet})
 * so that a loader can name the file line.
 *
 * <p>Flow determinability: the unmetered flows are unknowns of the linear system made of each
 * component's mass balance (a closed feedwater heater has two, tube side and shell side) and the
 * adiabatic energy balances of feedwater heaters and mixers. The enthalpies in those balances are not
 * known before the plant runs, so the check uses arbitrary distinct enthalpies, which gives the rank
 * the system has for all but a vanishing set of operating states. A flow is determined when every
 * solution of the homogeneous system has it zero.
 */
public final class PlantValidator {

    private PlantValidator() {
    }

    /**
     * Checks a plant description.
     *
     * @param plant the description as loaded; references between its parts need not resolve
     * @return the problems found, in the order of the description; empty when it is sound
     */
    public static List<PlantProblem> validate(PlantDescription plant) {
        List<PlantProblem> problems = new ArrayList<>();
        checkUnitIds(plant, problems);
        checkSensorIds(plant, problems);
        for (int u = 0; u < plant.units().size(); u++) {
            new UnitCheck(plant, u, problems).run();
        }
        return List.copyOf(problems);
    }

    private static void checkUnitIds(PlantDescription plant, List<PlantProblem> problems) {
        Map<String, Integer> first = new HashMap<>();
        for (int u = 0; u < plant.units().size(); u++) {
            String id = plant.units().get(u).id();
            Integer earlier = first.putIfAbsent(id, u);
            if (earlier != null) {
                problems.add(new PlantProblem("units[" + u + "].id", Kind.DUPLICATE,
                        "unit id \"" + id + "\" is declared twice", Set.of(id),
                        Optional.of("units[" + earlier + "].id")));
            }
        }
    }

    private static void checkSensorIds(PlantDescription plant, List<PlantProblem> problems) {
        Map<String, String> first = new HashMap<>();
        Map<String, String> firstUnit = new HashMap<>();
        for (int u = 0; u < plant.units().size(); u++) {
            UnitDescription unit = plant.units().get(u);
            for (int s = 0; s < unit.sensors().size(); s++) {
                String id = unit.sensors().get(s).id();
                String path = "units[" + u + "].sensors[" + s + "].id";
                String earlier = first.putIfAbsent(id, path);
                if (earlier != null) {
                    String where = firstUnit.get(id).equals(unit.id()) ? "" : " (also in unit \"" + firstUnit.get(id) + "\")";
                    problems.add(new PlantProblem(path, Kind.DUPLICATE,
                            "sensor id \"" + id + "\" is declared twice" + where
                                    + "; sensor ids must be unique within the site",
                            Set.of(id), Optional.of(earlier)));
                } else {
                    firstUnit.put(id, unit.id());
                }
            }
        }
    }

    /** A component port: the key it is declared under, the state it names, and its direction. */
    private record Port(String key, String label, String stateId, boolean inlet) {
    }

    private static List<Port> ports(Component component) {
        List<Port> ports = new ArrayList<>();
        if (component instanceof TurbineSection c) {
            ports.add(new Port("inlet", "inlet", c.inlet(), true));
            listPorts(ports, "extractions", c.extractions(), false);
            ports.add(new Port("outlet", "outlet", c.outlet(), false));
        } else if (component instanceof ClosedFeedwaterHeater c) {
            ports.add(new Port("feedwater_inlet", "feedwater_inlet", c.feedwaterInlet(), true));
            ports.add(new Port("feedwater_outlet", "feedwater_outlet", c.feedwaterOutlet(), false));
            ports.add(new Port("steam_inlet", "steam_inlet", c.steamInlet(), true));
            listPorts(ports, "drain_inlets", c.drainInlets(), true);
            ports.add(new Port("drain_outlet", "drain_outlet", c.drainOutlet(), false));
        } else if (component instanceof Condenser || component instanceof OpenFeedwaterHeater
                || component instanceof Mixer) {
            listPorts(ports, "inlets", component.inlets(), true);
            ports.add(new Port("outlet", "outlet", component.outlets().get(0), false));
        } else if (!(component instanceof Generator)) {
            // Steam generator, reheater and pump: one inlet, one outlet. A generator has a shaft only.
            ports.add(new Port("inlet", "inlet", component.inlets().get(0), true));
            ports.add(new Port("outlet", "outlet", component.outlets().get(0), false));
        }
        return ports;
    }

    private static void listPorts(List<Port> ports, String key, List<String> states, boolean inlet) {
        for (int i = 0; i < states.size(); i++) {
            ports.add(new Port(key + "[" + i + "]", key, states.get(i), inlet));
        }
    }

    /** The checks of one unit. */
    private static final class UnitCheck {
        private final PlantDescription plant;
        private final UnitDescription unit;
        private final String unitPath;
        private final List<PlantProblem> problems;
        private final Map<String, Integer> stateIndex = new LinkedHashMap<>();
        private final Map<String, Integer> componentIndex = new LinkedHashMap<>();
        private final Map<String, Sensor> sensors = new HashMap<>();
        /** Turbine id → the generator that names it first. */
        private final Map<String, String> generatorOfTurbine = new HashMap<>();

        UnitCheck(PlantDescription plant, int u, List<PlantProblem> problems) {
            this.plant = plant;
            this.unit = plant.units().get(u);
            this.unitPath = "units[" + u + "]";
            this.problems = problems;
        }

        void run() {
            for (Sensor sensor : unit.sensors()) {
                sensors.putIfAbsent(sensor.id(), sensor);
            }
            checkSameMeasurand();
            indexStates();
            indexComponents();
            checkStates();
            checkComponents();
            int before = problems.size();
            checkConnections();
            // Flow balances over a broken flow graph would only repeat the connection problems.
            if (problems.size() == before) {
                checkDeterminability();
            }
        }

        private void add(String path, Kind kind, String message, String... subjects) {
            problems.add(new PlantProblem(path, kind, message, Set.of(distinct(subjects)), Optional.empty()));
        }

        private static String[] distinct(String[] ids) {
            return new LinkedHashSet<>(List.of(ids)).toArray(new String[0]);
        }

        private void indexStates() {
            for (int j = 0; j < unit.states().size(); j++) {
                String id = unit.states().get(j).id();
                Integer earlier = stateIndex.putIfAbsent(id, j);
                if (earlier != null) {
                    problems.add(new PlantProblem(statePath(j) + ".id", Kind.DUPLICATE,
                            "state id \"" + id + "\" is declared twice in unit \"" + unit.id() + "\"", Set.of(id),
                            Optional.of(statePath(earlier) + ".id")));
                }
            }
        }

        private void indexComponents() {
            for (int k = 0; k < unit.components().size(); k++) {
                String id = unit.components().get(k).id();
                Integer earlier = componentIndex.putIfAbsent(id, k);
                if (earlier != null) {
                    problems.add(new PlantProblem(componentPath(k) + ".id", Kind.DUPLICATE,
                            "component id \"" + id + "\" is declared twice in unit \"" + unit.id() + "\"", Set.of(id),
                            Optional.of(componentPath(earlier) + ".id")));
                }
            }
        }

        private String statePath(int j) {
            return unitPath + ".states[" + j + "]";
        }

        private String componentPath(int k) {
            return unitPath + ".components[" + k + "]";
        }

        private Optional<StateDefinition> state(String id) {
            Integer j = stateIndex.get(id);
            return j == null ? Optional.empty() : Optional.of(unit.states().get(j));
        }

        private Optional<Component> component(String id) {
            Integer k = componentIndex.get(id);
            return k == null ? Optional.empty() : Optional.of(unit.components().get(k));
        }

        // ---- duplicate transmitters

        /**
         * A sensor declared {@code same_measurand_as} another must name a sensor of the same unit, of
         * the same quantity, that is not itself a duplicate: pairs are star-shaped around one primary,
         * so the primary is the value the cycle model uses and each duplicate is checked against it.
         */
        private void checkSameMeasurand() {
            for (int i = 0; i < unit.sensors().size(); i++) {
                Sensor s = unit.sensors().get(i);
                if (s.sameMeasurandAs().isEmpty()) {
                    continue;
                }
                String path = unitPath + ".sensors[" + i + "].same_measurand_as";
                String primaryId = s.sameMeasurandAs().get();
                Sensor primary = sensors.get(primaryId);
                if (primary == null) {
                    Optional<String> elsewhere = plant.units().stream()
                            .filter(other -> other.sensor(primaryId).isPresent())
                            .map(UnitDescription::id)
                            .findFirst();
                    add(path, Kind.REFERENCE, "sensor \"" + s.id() + "\" is declared the same measurand as sensor \""
                            + primaryId + "\", which" + elsewhere.map(u -> " belongs to unit \"" + u + "\", not to unit \""
                            + unit.id() + "\"").orElse(" is not declared"), s.id(), primaryId);
                } else if (primary.quantity() != s.quantity()) {
                    add(path, Kind.REFERENCE, "sensor \"" + s.id() + "\" measures " + s.quantity().label()
                            + " but is declared the same measurand as sensor \"" + primaryId + "\", which measures "
                            + primary.quantity().label(), s.id(), primaryId);
                } else if (primary.isDuplicate()) {
                    add(path, Kind.REFERENCE, "sensor \"" + s.id() + "\" is declared the same measurand as sensor \""
                            + primaryId + "\", which is itself a duplicate of \"" + primary.sameMeasurandAs().get()
                            + "\": name \"" + primary.sameMeasurandAs().get() + "\" instead", s.id(), primaryId);
                }
            }
        }

        // ---- sensors named by states and components

        private void checkSensor(String sensorId, Quantity expected, String path, String role, String owner) {
            Sensor sensor = sensors.get(sensorId);
            if (sensor == null) {
                Optional<String> elsewhere = plant.units().stream()
                        .filter(other -> other.sensor(sensorId).isPresent())
                        .map(UnitDescription::id)
                        .findFirst();
                String why = elsewhere
                        .map(other -> " belongs to unit \"" + other + "\", not to unit \"" + unit.id() + "\"")
                        .orElse(" is not declared");
                add(path, Kind.REFERENCE, "sensor \"" + sensorId + "\" named as " + role + why, sensorId, owner);
                return;
            }
            if (!sensor.quantity().siUnit().equals(expected.siUnit())) {
                add(path, Kind.REFERENCE, "sensor \"" + sensorId + "\" measures " + sensor.quantity().label()
                        + " but is used as " + role, sensorId, owner);
            } else if (sensor.isDuplicate()) {
                // the model uses the primary; the duplicate only checks it
                add(path, Kind.REFERENCE, "sensor \"" + sensorId + "\" is a second measurement of \""
                        + sensor.sameMeasurandAs().get() + "\" (same_measurand_as) and cannot be used as " + role
                        + ": name \"" + sensor.sameMeasurandAs().get() + "\" here", sensorId, owner);
            }
        }

        // ---- states

        private void checkStates() {
            Map<String, String> measurementUser = new HashMap<>();
            for (int j = 0; j < unit.states().size(); j++) {
                StateDefinition state = unit.states().get(j);
                String path = statePath(j);
                String of = " of state \"" + state.id() + "\"";
                StateFix fix = state.fix();
                if (fix instanceof StateFix.MeasuredPressureTemperature f) {
                    checkSensor(f.pressureSensor(), Quantity.PRESSURE, path + ".fixed_by.measured.p",
                            "the pressure" + of, state.id());
                    checkSensor(f.temperatureSensor(), Quantity.TEMPERATURE, path + ".fixed_by.measured.T",
                            "the temperature" + of, state.id());
                } else if (fix instanceof StateFix.SaturatedLiquid f) {
                    checkSensor(f.pressureSensor(), Quantity.PRESSURE, path + ".fixed_by.saturated_liquid.p",
                            "the pressure" + of, state.id());
                } else if (fix instanceof StateFix.SaturatedVapour f) {
                    checkSensor(f.pressureSensor(), Quantity.PRESSURE, path + ".fixed_by.saturated_vapour.p",
                            "the pressure" + of, state.id());
                } else if (fix instanceof StateFix.PressureQuality f) {
                    checkSensor(f.pressureSensor(), Quantity.PRESSURE, path + ".fixed_by.quality.p",
                            "the pressure" + of, state.id());
                } else if (fix instanceof StateFix.EnergyBalance f) {
                    checkSensor(f.pressureSensor(), Quantity.PRESSURE, path + ".fixed_by.energy_balance.p",
                            "the pressure" + of, state.id());
                    checkEnergyBalance(state, f, path + ".fixed_by.energy_balance.component", measurementUser);
                } else if (fix instanceof StateFix.Isentropic f) {
                    checkIsentropic(state, f, path + ".fixed_by.isentropic");
                }
                if (state.flowSensor().isPresent()) {
                    String sensorId = state.flowSensor().get();
                    if (state.isReference()) {
                        add(path + ".flow", Kind.REFERENCE, "state \"" + state.id()
                                + "\" is an isentropic reference, which carries no flow, but names flow sensor \""
                                + sensorId + "\"", state.id(), sensorId);
                    } else {
                        checkSensor(sensorId, Quantity.MASS_FLOW, path + ".flow", "the flow" + of, state.id());
                    }
                }
                if (state.checkFlowSensor().isPresent()) {
                    String sensorId = state.checkFlowSensor().get();
                    if (state.isReference()) {
                        add(path + ".check_flow", Kind.REFERENCE, "state \"" + state.id()
                                + "\" is an isentropic reference, which carries no flow, but names check-flow sensor \""
                                + sensorId + "\"", state.id(), sensorId);
                    } else {
                        checkSensor(sensorId, Quantity.MASS_FLOW, path + ".check_flow", "the check flow" + of,
                                state.id());
                    }
                }
            }
        }

        private void checkEnergyBalance(StateDefinition state, StateFix.EnergyBalance fix, String path,
                                        Map<String, String> measurementUser) {
            String lead = "state \"" + state.id() + "\" is fixed by the energy balance of component \""
                    + fix.componentId() + "\"";
            Optional<Component> found = component(fix.componentId());
            if (found.isEmpty()) {
                add(path, Kind.REFERENCE, lead + ", which is not declared", state.id(), fix.componentId());
                return;
            }
            Component component = found.get();
            boolean atPort = ports(component).stream().anyMatch(p -> p.stateId().equals(state.id()));
            if (!atPort) {
                add(path, Kind.REFERENCE, lead + ", but is not at any of its ports", state.id(), component.id());
                return;
            }
            String measurement;
            String measurementName;
            String lacking;
            if (component instanceof Condenser c) {
                measurement = c.coolingWater().isPresent() ? c.id() : null;
                measurementName = "the cooling-water duty of condenser \"" + c.id() + "\"";
                lacking = "a condenser without cooling_water measurement to fix it";
            } else if (component instanceof TurbineSection t) {
                Optional<String> generator = drivingGenerator(t);
                measurement = generator.map(g -> "generator " + g).orElse(null);
                measurementName = "the output of generator \"" + generator.orElse("") + "\"";
                lacking = "a turbine that drives no generator to fix it";
            } else if (component instanceof Pump p) {
                measurement = p.motor().isPresent() ? p.id() : null;
                measurementName = "the motor power of pump \"" + p.id() + "\"";
                lacking = "a pump without motor measurement to fix it";
            } else if (component instanceof Mixer x) {
                // No measurement: the adiabatic mixing of the inlets, once their flows are known.
                measurement = x.outlet().equals(state.id()) ? "mixer " + x.id() : null;
                measurementName = "the mixing in mixer \"" + x.id() + "\"";
                lacking = "but it is an inlet of that mixer: only a mixer's outlet takes its enthalpy from the"
                        + " adiabatic mixing of the inlets";
            } else if (component instanceof SteamGenerator b) {
                measurement = b.fuel().isPresent() ? b.id() : null;
                measurementName = "the fuel heat of steam generator \"" + b.id() + "\"";
                lacking = "a steam generator without fuel measurement to fix it";
            } else {
                measurement = null;
                measurementName = "";
                lacking = "a " + component.type() + " with no independent measurement to fix it (only a condenser"
                        + " with cooling water, a turbine with a generator, a pump with a motor or a steam generator"
                        + " with fuel can, and a mixer its outlet)";
            }
            if (measurement == null) {
                add(path, Kind.MEASUREMENT, lead + ", " + lacking, state.id(), component.id());
                return;
            }
            String earlier = measurementUser.putIfAbsent(measurement, state.id());
            if (earlier != null) {
                add(path, Kind.MEASUREMENT, "states \"" + earlier + "\" and \"" + state.id()
                        + "\" are both fixed by " + measurementName + "; one measurement fixes one state",
                        earlier, state.id(), component.id());
            }
        }

        private Optional<String> drivingGenerator(TurbineSection turbine) {
            for (Component c : unit.components()) {
                if (c instanceof Generator g && g.turbines().contains(turbine.id())) {
                    return Optional.of(g.id());
                }
            }
            return Optional.empty();
        }

        private void checkIsentropic(StateDefinition state, StateFix.Isentropic fix, String path) {
            checkReferenceEnd(state, fix.fromState(), path + ".from", "from");
            checkReferenceEnd(state, fix.pressureOfState(), path + ".p_of", "p_of");
        }

        private void checkReferenceEnd(StateDefinition state, String named, String path, String key) {
            Optional<StateDefinition> end = state(named);
            String lead = "isentropic state \"" + state.id() + "\" names state \"" + named + "\" (" + key + ")";
            if (end.isEmpty()) {
                add(path, Kind.REFERENCE, lead + ", which is not declared", state.id(), named);
            } else if (end.get().isReference()) {
                add(path, Kind.REFERENCE, lead + ", which is itself an isentropic reference", state.id(), named);
            }
        }

        // ---- components

        private void checkComponents() {
            for (int k = 0; k < unit.components().size(); k++) {
                Component component = unit.components().get(k);
                String path = componentPath(k);
                for (Port port : ports(component)) {
                    Optional<StateDefinition> state = state(port.stateId());
                    String lead = "state \"" + port.stateId() + "\" named by component \"" + component.id()
                            + "\" (port " + port.label() + ")";
                    if (state.isEmpty()) {
                        add(path + "." + port.key(), Kind.REFERENCE, lead + " is not declared",
                                port.stateId(), component.id());
                    } else if (state.get().isReference()) {
                        add(path + "." + port.key(), Kind.REFERENCE, lead
                                        + " is an isentropic reference, which carries no flow and belongs to no port",
                                port.stateId(), component.id());
                    }
                }
                String of = " of " + component.type() + " \"" + component.id() + "\"";
                if (component instanceof SteamGenerator b && b.fuel().isPresent()) {
                    FuelMeasurement fuel = b.fuel().get();
                    checkSensor(fuel.flowSensor(), Quantity.MASS_FLOW, path + ".fuel.flow", "the fuel flow" + of,
                            b.id());
                    positive(fuel.heatingValueJPerKg(), path + ".fuel.heating_value", "the fuel heating value" + of,
                            b.id());
                    fraction(fuel.boilerEfficiency(), path + ".fuel.efficiency", "the boiler efficiency" + of, b.id());
                } else if (component instanceof TurbineSection t && t.idealOutlet().isPresent()) {
                    checkIdealOutlet(t.id(), t.type(), t.inlet(), t.outlet(), t.idealOutlet().get(),
                            path + ".ideal_outlet");
                } else if (component instanceof Pump p) {
                    if (p.motor().isPresent()) {
                        MotorMeasurement motor = p.motor().get();
                        checkSensor(motor.powerSensor(), Quantity.POWER, path + ".motor.power",
                                "the motor power" + of, p.id());
                        fraction(motor.efficiency(), path + ".motor.efficiency", "the motor efficiency" + of, p.id());
                    }
                    if (p.idealOutlet().isPresent()) {
                        checkIdealOutlet(p.id(), p.type(), p.inlet(), p.outlet(), p.idealOutlet().get(),
                                path + ".ideal_outlet");
                    }
                } else if (component instanceof Condenser c && c.coolingWater().isPresent()) {
                    CoolingWater cw = c.coolingWater().get();
                    checkSensor(cw.flowSensor(), Quantity.MASS_FLOW, path + ".cooling_water.flow",
                            "the cooling-water flow" + of, c.id());
                    checkSensor(cw.inletTemperatureSensor(), Quantity.TEMPERATURE,
                            path + ".cooling_water.inlet_temperature", "the cooling-water inlet temperature" + of,
                            c.id());
                    checkSensor(cw.outletTemperatureSensor(), Quantity.TEMPERATURE,
                            path + ".cooling_water.outlet_temperature", "the cooling-water outlet temperature" + of,
                            c.id());
                } else if (component instanceof Generator g) {
                    checkGenerator(g, path, of);
                }
            }
        }

        private void checkIdealOutlet(String componentId, String type, String inlet, String outlet, String ideal,
                                      String path) {
            String lead = "ideal_outlet \"" + ideal + "\" of " + type + " \"" + componentId + "\"";
            Optional<StateDefinition> state = state(ideal);
            if (state.isEmpty()) {
                add(path, Kind.REFERENCE, lead + " is not declared", ideal, componentId);
            } else if (!(state.get().fix() instanceof StateFix.Isentropic fix)) {
                add(path, Kind.REFERENCE, lead + " is not fixed as isentropic", ideal, componentId);
            } else {
                if (!fix.fromState().equals(inlet)) {
                    add(path, Kind.REFERENCE, lead + " starts from state \"" + fix.fromState()
                            + "\", not from the " + type + "'s inlet \"" + inlet + "\"", ideal, componentId);
                }
                if (!fix.pressureOfState().equals(outlet)) {
                    add(path, Kind.REFERENCE, lead + " ends at the pressure of state \"" + fix.pressureOfState()
                            + "\", not at that of the " + type + "'s outlet \"" + outlet + "\"", ideal, componentId);
                }
            }
        }

        private void checkGenerator(Generator generator, String path, String of) {
            checkSensor(generator.powerSensor(), Quantity.POWER, path + ".power", "the power" + of, generator.id());
            fraction(generator.efficiency(), path + ".efficiency", "the efficiency" + of, generator.id());
            if (generator.turbines().isEmpty()) {
                add(path + ".turbines", Kind.REFERENCE, "generator \"" + generator.id() + "\" names no turbine",
                        generator.id());
            }
            for (int i = 0; i < generator.turbines().size(); i++) {
                String turbine = generator.turbines().get(i);
                String turbinePath = path + ".turbines[" + i + "]";
                Optional<Component> found = component(turbine);
                if (found.isEmpty()) {
                    add(turbinePath, Kind.REFERENCE, "turbine \"" + turbine + "\" named by generator \""
                            + generator.id() + "\" is not declared", turbine, generator.id());
                } else if (!(found.get() instanceof TurbineSection)) {
                    add(turbinePath, Kind.REFERENCE, "generator \"" + generator.id() + "\" names \"" + turbine
                            + "\", which is a " + found.get().type() + ", not a turbine", turbine, generator.id());
                } else {
                    String earlier = generatorOfTurbine.putIfAbsent(turbine, generator.id());
                    if (earlier != null) {
                        add(turbinePath, Kind.REFERENCE, "turbine \"" + turbine + "\" is named by generators \""
                                + earlier + "\" and \"" + generator.id() + "\"; a turbine drives one generator",
                                turbine, generator.id());
                    }
                }
            }
        }

        private void positive(UncertainConstant constant, String path, String what, String owner) {
            if (!(constant.value() > 0.0)) {
                add(path + ".value", Kind.MEASUREMENT, what + " must be positive, was " + constant.value(), owner);
            }
        }

        private void fraction(UncertainConstant constant, String path, String what, String owner) {
            if (!(constant.value() > 0.0 && constant.value() <= 1.0)) {
                add(path + ".value", Kind.MEASUREMENT, what + " must be a fraction within 0 to 1 (0.95, not 95),"
                        + " was " + constant.value(), owner);
            }
        }

        // ---- connections

        private void checkConnections() {
            Map<String, List<String>> leaves = new HashMap<>();
            Map<String, List<String>> enters = new HashMap<>();
            for (Component component : unit.components()) {
                for (Port port : ports(component)) {
                    (port.inlet() ? enters : leaves)
                            .computeIfAbsent(port.stateId(), s -> new ArrayList<>()).add(component.id());
                }
            }
            for (int j = 0; j < unit.states().size(); j++) {
                StateDefinition state = unit.states().get(j);
                if (state.isReference() || stateIndex.get(state.id()) != j) {
                    continue;
                }
                connection(state, j, "leaves", leaves.getOrDefault(state.id(), List.of()));
                connection(state, j, "enters", enters.getOrDefault(state.id(), List.of()));
            }
        }

        private void connection(StateDefinition state, int j, String verb, List<String> components) {
            if (components.size() == 1) {
                return;
            }
            String message;
            if (components.isEmpty()) {
                message = "state \"" + state.id() + "\" " + verb + " no component";
            } else {
                message = "state \"" + state.id() + "\" " + verb + " " + count(components.size()) + " components: "
                        + joinAnd(components);
            }
            List<String> subjects = new ArrayList<>(components);
            subjects.add(state.id());
            add(statePath(j) + ".id", Kind.CONNECTION, message, subjects.toArray(new String[0]));
        }

        private static String count(int n) {
            return switch (n) {
                case 2 -> "two";
                case 3 -> "three";
                case 4 -> "four";
                default -> Integer.toString(n);
            };
        }

        private static String joinAnd(List<String> items) {
            if (items.size() == 1) {
                return items.get(0);
            }
            return String.join(", ", items.subList(0, items.size() - 1)) + " and " + items.get(items.size() - 1);
        }

        // ---- flow determinability

        private void checkDeterminability() {
            List<String> flowing = new ArrayList<>();
            Map<String, Integer> column = new HashMap<>();
            for (StateDefinition state : unit.states()) {
                if (!state.isReference() && !column.containsKey(state.id())) {
                    column.put(state.id(), flowing.size());
                    flowing.add(state.id());
                }
            }
            if (flowing.isEmpty()) {
                return;
            }
            // Fixed seed: the check must give the same answer on every run.
            SplittableRandom random = new SplittableRandom(0x5EED_F10DL);
            double[] enthalpy = new double[flowing.size()];
            for (int i = 0; i < enthalpy.length; i++) {
                enthalpy[i] = 1.0 + 3.0 * random.nextDouble();
            }
            // A mixer whose outlet takes its enthalpy from the mixing has no energy balance of its own
            // here; where that outlet enters another balance, its m h is the sum of the inlets' m h.
            Map<String, Mixer> mixingOutlets = new HashMap<>();
            for (StateDefinition state : unit.states()) {
                if (state.fix() instanceof StateFix.EnergyBalance eb
                        && component(eb.componentId()).orElse(null) instanceof Mixer x && x.outlet().equals(state.id())) {
                    mixingOutlets.put(state.id(), x);
                }
            }
            List<double[]> rows = new ArrayList<>();
            for (Component component : unit.components()) {
                List<Port> ports = ports(component);
                if (component instanceof ClosedFeedwaterHeater) {
                    rows.add(massRow(ports, column, flowing.size(), p -> p.key().startsWith("feedwater")));
                    rows.add(massRow(ports, column, flowing.size(), p -> !p.key().startsWith("feedwater")));
                } else if (!ports.isEmpty()) {
                    rows.add(massRow(ports, column, flowing.size(), p -> true));
                }
                boolean mixing = component instanceof Mixer x && mixingOutlets.containsKey(x.outlet());
                if (component instanceof ClosedFeedwaterHeater || component instanceof OpenFeedwaterHeater
                        || component instanceof Mixer && !mixing) {
                    double[] row = new double[flowing.size()];
                    for (Port port : ports) {
                        double sign = port.inlet() ? 1.0 : -1.0;
                        Mixer mixer = mixingOutlets.get(port.stateId());
                        for (String id : mixer == null ? List.of(port.stateId()) : mixer.inlets()) {
                            Integer c = column.get(id);
                            if (c != null) {
                                row[c] += sign * enthalpy[c];
                            }
                        }
                    }
                    rows.add(row);
                }
            }
            List<Integer> unknown = new ArrayList<>();
            for (StateDefinition state : unit.states()) {
                Integer c = column.get(state.id());
                if (c != null && state.flowSensor().isEmpty() && !unknown.contains(c)) {
                    unknown.add(c);
                }
            }
            if (unknown.size() == flowing.size()) {
                add(unitPath + ".states", Kind.DETERMINABILITY, "no state of unit \"" + unit.id()
                                + "\" has a flow sensor: measure at least the main steam or the feedwater flow",
                        flowing.toArray(new String[0]));
                return;
            }
            List<String> undetermined = new ArrayList<>();
            for (int u : undeterminedColumns(rows, unknown)) {
                undetermined.add(flowing.get(u));
            }
            if (!undetermined.isEmpty()) {
                int first = stateIndex.get(undetermined.get(0));
                add(statePath(first) + ".id", Kind.DETERMINABILITY, (undetermined.size() == 1
                                ? "the flow of state \"" + undetermined.get(0) + "\" cannot"
                                : "the flows of states " + quotedList(undetermined) + " cannot")
                                + " be determined from the measured flows and the mass and heater energy balances;"
                                + " measure one of them or a flow that fixes it",
                        undetermined.toArray(new String[0]));
            }
        }

        private static String quotedList(List<String> ids) {
            List<String> quoted = new ArrayList<>();
            for (String id : ids) {
                quoted.add("\"" + id + "\"");
            }
            return joinAnd(quoted);
        }

        private static double[] massRow(List<Port> ports, Map<String, Integer> column, int width,
                                        Predicate<Port> side) {
            double[] row = new double[width];
            for (Port port : ports) {
                Integer c = column.get(port.stateId());
                if (c != null && side.test(port)) {
                    row[c] += port.inlet() ? 1.0 : -1.0;
                }
            }
            return row;
        }

        /**
         * The unknowns (columns of {@code rows}) that the homogeneous system leaves free: reduce the
         * unknown columns to row echelon form; a free column, and every pivot column coupled to one, is
         * undetermined.
         */
        private static List<Integer> undeterminedColumns(List<double[]> rows, List<Integer> unknown) {
            int n = unknown.size();
            double[][] a = new double[rows.size()][n];
            for (int r = 0; r < rows.size(); r++) {
                for (int c = 0; c < n; c++) {
                    a[r][c] = rows.get(r)[unknown.get(c)];
                }
            }
            // Entries are of order 1 (mass) and 1 to 4 (energy): an absolute threshold far above the
            // rounding of a few dozen eliminations and far below any true coefficient.
            double tolerance = 1e-9;
            int[] pivotRowOfColumn = new int[n];
            Arrays.fill(pivotRowOfColumn, -1);
            int rank = 0;
            for (int c = 0; c < n && rank < a.length; c++) {
                int best = rank;
                for (int r = rank + 1; r < a.length; r++) {
                    if (Math.abs(a[r][c]) > Math.abs(a[best][c])) {
                        best = r;
                    }
                }
                if (Math.abs(a[best][c]) < tolerance) {
                    continue;
                }
                double[] swap = a[rank];
                a[rank] = a[best];
                a[best] = swap;
                double pivot = a[rank][c];
                for (int k = 0; k < n; k++) {
                    a[rank][k] /= pivot;
                }
                for (int r = 0; r < a.length; r++) {
                    if (r != rank && a[r][c] != 0.0) {
                        double factor = a[r][c];
                        for (int k = 0; k < n; k++) {
                            a[r][k] -= factor * a[rank][k];
                        }
                    }
                }
                pivotRowOfColumn[c] = rank;
                rank++;
            }
            List<Integer> free = new ArrayList<>();
            for (int c = 0; c < n; c++) {
                if (pivotRowOfColumn[c] < 0) {
                    free.add(c);
                }
            }
            List<Integer> undetermined = new ArrayList<>();
            for (int c = 0; c < n; c++) {
                boolean isFree = pivotRowOfColumn[c] < 0;
                boolean coupled = false;
                if (!isFree) {
                    for (int f : free) {
                        if (Math.abs(a[pivotRowOfColumn[c]][f]) > tolerance) {
                            coupled = true;
                            break;
                        }
                    }
                }
                if (isFree || coupled) {
                    undetermined.add(unknown.get(c));
                }
            }
            return undetermined;
        }
    }
}
