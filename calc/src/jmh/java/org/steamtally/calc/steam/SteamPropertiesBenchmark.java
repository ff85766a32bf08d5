package org.steamtally.calc.steam;

import com.hummeling.if97.IF97;
import com.hummeling.if97.OutOfRangeException;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Our IF97 facade side by side with the independent {@code com.hummeling:if97} on the same inputs.
 * Each operation has a pair of methods, {@code ...Ours} and {@code ...Reference}, so one run shows
 * both under the same load. Both sides are called through their public facades, which validate the
 * input and choose the region, as a caller would. Inputs live in non-final fields so that the JIT
 * cannot fold them; every method returns its result so that the work cannot be removed.
 *
 * <p>The reference works in MPa and kJ/kg; its inputs are converted once, in {@link #setUp()}.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class SteamPropertiesBenchmark {

    private final IF97 reference = new IF97(IF97.UnitSystem.DEFAULT);

    /** Feedwater: compressed liquid, region 1. */
    double p1 = 18e6;
    double t1 = 500.0;
    /** Main steam: superheated vapour, region 2. */
    double p2 = 12e6;
    double t2 = 810.0;
    /** Near-critical supercritical fluid, region 3. */
    double p3 = 30e6;
    double t3 = 680.0;
    /** High-temperature vapour, region 5. */
    double p5 = 20e6;
    double t5 = 1500.0;
    /** A wet turbine exhaust at a condenser pressure, region 4. */
    double pWet = 8e3;
    double xWet = 0.91;

    double h1;
    double h2;
    double hWet;
    double sWet;

    double p1MPa;
    double p2MPa;
    double p3MPa;
    double p5MPa;
    double pWetMPa;
    double h1kJ;
    double h2kJ;
    double hWetkJ;
    double sWetkJ;

    @Setup
    public void setUp() {
        h1 = Steam.enthalpyPT(p1, t1);
        h2 = Steam.enthalpyPT(p2, t2);
        SteamState wet = Steam.statePX(pWet, xWet);
        hWet = wet.enthalpyJPerKg();
        sWet = wet.entropyJPerKgK();
        p1MPa = p1 / 1e6;
        p2MPa = p2 / 1e6;
        p3MPa = p3 / 1e6;
        p5MPa = p5 / 1e6;
        pWetMPa = pWet / 1e6;
        h1kJ = h1 / 1e3;
        h2kJ = h2 / 1e3;
        hWetkJ = hWet / 1e3;
        sWetkJ = sWet / 1e3;
    }

    @Benchmark
    public double enthalpyRegion1Ours() {
        return Steam.enthalpyPT(p1, t1);
    }

    @Benchmark
    public double enthalpyRegion1Reference() throws OutOfRangeException {
        return reference.specificEnthalpyPT(p1MPa, t1);
    }

    @Benchmark
    public double enthalpyRegion2Ours() {
        return Steam.enthalpyPT(p2, t2);
    }

    @Benchmark
    public double enthalpyRegion2Reference() throws OutOfRangeException {
        return reference.specificEnthalpyPT(p2MPa, t2);
    }

    @Benchmark
    public double enthalpyRegion3Ours() {
        return Steam.enthalpyPT(p3, t3);
    }

    @Benchmark
    public double enthalpyRegion3Reference() throws OutOfRangeException {
        return reference.specificEnthalpyPT(p3MPa, t3);
    }

    @Benchmark
    public double enthalpyRegion5Ours() {
        return Steam.enthalpyPT(p5, t5);
    }

    @Benchmark
    public double enthalpyRegion5Reference() throws OutOfRangeException {
        return reference.specificEnthalpyPT(p5MPa, t5);
    }

    @Benchmark
    public double temperaturePHRegion1Ours() {
        return Steam.temperaturePH(p1, h1);
    }

    @Benchmark
    public double temperaturePHRegion1Reference() throws OutOfRangeException {
        return reference.temperaturePH(p1MPa, h1kJ);
    }

    @Benchmark
    public double temperaturePHRegion2Ours() {
        return Steam.temperaturePH(p2, h2);
    }

    @Benchmark
    public double temperaturePHRegion2Reference() throws OutOfRangeException {
        return reference.temperaturePH(p2MPa, h2kJ);
    }

    /** Full wet state from (p, h): our record against the reference's s and v from the same pair. */
    @Benchmark
    public SteamState wetStatePHOurs() {
        return Steam.statePH(pWet, hWet);
    }

    @Benchmark
    public double wetStatePHReference() throws OutOfRangeException {
        return reference.specificEntropyPH(pWetMPa, hWetkJ)
                + reference.specificVolumePH(pWetMPa, hWetkJ)
                + reference.temperaturePH(pWetMPa, hWetkJ);
    }

    @Benchmark
    public SteamState wetStatePSOurs() {
        return Steam.statePS(pWet, sWet);
    }

    @Benchmark
    public double wetStatePSReference() throws OutOfRangeException {
        return reference.specificEnthalpyPS(pWetMPa, sWetkJ)
                + reference.specificVolumePS(pWetMPa, sWetkJ)
                + reference.temperaturePS(pWetMPa, sWetkJ);
    }

    @Benchmark
    public double saturationTemperatureOurs() {
        return Steam.saturationTemperature(pWet);
    }

    @Benchmark
    public double saturationTemperatureReference() throws OutOfRangeException {
        return reference.saturationTemperatureP(pWetMPa);
    }
}
