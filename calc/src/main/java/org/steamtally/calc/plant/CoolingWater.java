package org.steamtally.calc.plant;

/**
 * The cooling-water side of a condenser: its duty m_cw · (h(p_cw, T_out) − h(p_cw, T_in)) by IF97, an
 * independent measure of the heat rejected.
 *
 * @param flowSensor              cooling-water mass-flow sensor
 * @param inletTemperatureSensor  cooling-water inlet temperature sensor
 * @param outletTemperatureSensor cooling-water outlet temperature sensor
 * @param pressurePa              cooling-water pressure in the tubes, Pa (its effect on h is small)
 */
public record CoolingWater(String flowSensor, String inletTemperatureSensor, String outletTemperatureSensor,
                           double pressurePa) {
}
