package org.steamtally.calc.plant;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * A component of the unit and the states at its ports. Ports name states by id; the validator
 * checks that each names a state of the unit and that every flowing state leaves exactly one
 * component and enters exactly one.
 *
 * <p>Sign convention, stated once here and carried by the result's field names: {@code heat_in_W} is
 * positive into the working fluid, {@code work_out_W} positive out of the working fluid.
 */
public sealed interface Component {

    String id();

    /** The type name used in the plant description and the result record. */
    String type();

    /** States whose flow enters the component. */
    List<String> inlets();

    /** States whose flow leaves the component. */
    List<String> outlets();

    /** Boiler: economiser, evaporator and superheater lumped; heat in from the fuel. */
    record SteamGenerator(String id, String inlet, String outlet, Optional<FuelMeasurement> fuel) implements Component {
        public String type() {
            return "steam_generator";
        }

        public List<String> inlets() {
            return List.of(inlet);
        }

        public List<String> outlets() {
            return List.of(outlet);
        }
    }

    /** Reheater: heat in between two turbine sections. */
    record Reheater(String id, String inlet, String outlet) implements Component {
        public String type() {
            return "reheater";
        }

        public List<String> inlets() {
            return List.of(inlet);
        }

        public List<String> outlets() {
            return List.of(outlet);
        }
    }

    /**
     * One turbine section, from its inlet to its outlet, with optional extraction ports between.
     *
     * @param idealOutlet the isentropic reference state for the outlet, when declared, for the
     *                    section's isentropic efficiency
     */
    record TurbineSection(String id, String inlet, String outlet, List<String> extractions,
                          Optional<String> idealOutlet) implements Component {
        public TurbineSection {
            extractions = List.copyOf(extractions);
        }

        public String type() {
            return "turbine";
        }

        public List<String> inlets() {
            return List.of(inlet);
        }

        public List<String> outlets() {
            ArrayList<String> out = new ArrayList<>(extractions);
            out.add(outlet);
            return List.copyOf(out);
        }
    }

    /** Water-cooled condenser: exhaust steam and drains in, condensate out, heat to the cooling water. */
    record Condenser(String id, List<String> inlets, String outlet, Optional<CoolingWater> coolingWater)
            implements Component {
        public Condenser {
            inlets = List.copyOf(inlets);
        }

        public String type() {
            return "condenser";
        }

        public List<String> outlets() {
            return List.of(outlet);
        }
    }

    /**
     * Feed, condensate or drain pump.
     *
     * @param idealOutlet the isentropic reference state for the outlet, when declared
     */
    record Pump(String id, String inlet, String outlet, Optional<MotorMeasurement> motor,
                Optional<String> idealOutlet) implements Component {
        public String type() {
            return "pump";
        }

        public List<String> inlets() {
            return List.of(inlet);
        }

        public List<String> outlets() {
            return List.of(outlet);
        }
    }

    /** Open (direct-contact) feedwater heater or deaerator: all inlets mix into one outlet. */
    record OpenFeedwaterHeater(String id, List<String> inlets, String outlet) implements Component {
        public OpenFeedwaterHeater {
            inlets = List.copyOf(inlets);
        }

        public String type() {
            return "open_feedwater_heater";
        }

        public List<String> outlets() {
            return List.of(outlet);
        }
    }

    /**
     * Closed (shell-and-tube) feedwater heater: feedwater through the tubes; extraction steam and
     * drains from heaters upstream condense in the shell and leave as one drain, which cascades
     * backward to a lower-pressure heater or the condenser, or is pumped forward into the feedwater.
     */
    record ClosedFeedwaterHeater(String id, String feedwaterInlet, String feedwaterOutlet, String steamInlet,
                                 List<String> drainInlets, String drainOutlet) implements Component {
        public ClosedFeedwaterHeater {
            drainInlets = List.copyOf(drainInlets);
        }

        public String type() {
            return "closed_feedwater_heater";
        }

        public List<String> inlets() {
            ArrayList<String> in = new ArrayList<>();
            in.add(feedwaterInlet);
            in.add(steamInlet);
            in.addAll(drainInlets);
            return List.copyOf(in);
        }

        public List<String> outlets() {
            return List.of(feedwaterOutlet, drainOutlet);
        }
    }

    /** Adiabatic mixing point, e.g. where a pumped-forward drain joins the feedwater. */
    record Mixer(String id, List<String> inlets, String outlet) implements Component {
        public Mixer {
            inlets = List.copyOf(inlets);
        }

        public String type() {
            return "mixer";
        }

        public List<String> outlets() {
            return List.of(outlet);
        }
    }

    /**
     * Generator on the shaft of one or more turbine sections: no ports of its own; its electrical
     * output, divided by its efficiency, is an independent measure of their work.
     */
    record Generator(String id, List<String> turbines, String powerSensor, UncertainConstant efficiency)
            implements Component {
        public Generator {
            turbines = List.copyOf(turbines);
        }

        public String type() {
            return "generator";
        }

        public List<String> inlets() {
            return List.of();
        }

        public List<String> outlets() {
            return List.of();
        }
    }
}
