package org.steamtally.calc.plant;

/**
 * The fuel side of a steam generator: an independent measure of its heat input,
 * η_boiler · m_fuel · HV, to compare with the steam-side m · Δh.
 *
 * @param flowSensor         fuel mass-flow sensor
 * @param heatingValueJPerKg the fuel's heating value, J/kg, with its uncertainty
 * @param boilerEfficiency   the fraction of the fuel heat that reaches the working fluid
 */
public record FuelMeasurement(String flowSensor, UncertainConstant heatingValueJPerKg,
                              UncertainConstant boilerEfficiency) {
}
