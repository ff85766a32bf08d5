package org.steamtally.calc.plant;

/**
 * A pump's drive motor: electrical power times motor (and coupling) efficiency is an independent
 * measure of the pump's work on the fluid.
 *
 * @param powerSensor electrical input power sensor
 * @param efficiency  motor efficiency as a fraction, with its uncertainty
 */
public record MotorMeasurement(String powerSensor, UncertainConstant efficiency) {
}
