package org.steamtally.dashboard.view;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.steamtally.calc.steam.Steam;
import org.steamtally.calc.steam.SteamRangeException;

/**
 * The background of a temperature–entropy diagram, computed with IAPWS-IF97: the saturation dome and
 * isobars through the liquid, two-phase and vapour regions. The page draws these lines to scale and
 * puts the live states on them.
 */
public final class TsDiagram {

    /** Critical temperature, K (IAPWS R7-97(2012), eq. 3). */
    static final double CRITICAL_TEMPERATURE_K = 647.096;
    /** Critical pressure, Pa (IAPWS R7-97(2012), eq. 4). */
    static final double CRITICAL_PRESSURE_PA = 22.064e6;

    /** Lowest temperature drawn: just above the triple point, 273.16 K. */
    static final double T_MIN_K = 273.16;
    /** Highest temperature drawn: the upper limit of IF97 region 2, 1073.15 K, less a margin for the axis. */
    static final double T_MAX_K = 900.0;

    /** Where the dome is cut below the critical point: saturation properties converge there and a few mK more add nothing visible. */
    private static final double DOME_TOP_K = 647.0;
    private static final int DOME_POINTS = 80;
    private static final int SINGLE_PHASE_POINTS = 40;

    private TsDiagram() {
    }

    /** One point of a line, s in J/(kg·K), T in K. */
    public record Point(double entropyJPerKgK, double temperatureK) {
    }

    /** An isobar: its pressure and its points in increasing entropy. */
    public record Isobar(double pressurePa, List<Point> points) {
        public Isobar {
            points = List.copyOf(points);
        }
    }

    /**
     * The dome: saturated-liquid points from the triple point up to near the critical point, then
     * saturated-vapour points back down, so that joining them in order draws the whole curve.
     */
    public static List<Point> dome() {
        List<Point> liquid = new ArrayList<>();
        List<Point> vapour = new ArrayList<>();
        for (int i = 0; i <= DOME_POINTS; i++) {
            // Denser near the top, where the curve turns.
            double f = 1.0 - Math.pow(1.0 - (double) i / DOME_POINTS, 1.6);
            double t = T_MIN_K + f * (DOME_TOP_K - T_MIN_K);
            liquid.add(new Point(Steam.stateTX(t, 0.0).entropyJPerKgK(), t));
            vapour.add(new Point(Steam.stateTX(t, 1.0).entropyJPerKgK(), t));
        }
        List<Point> out = new ArrayList<>(liquid);
        for (int i = vapour.size() - 1; i >= 0; i--) {
            out.add(vapour.get(i));
        }
        return out;
    }

    /**
     * One isobar from {@link #T_MIN_K} to {@link #T_MAX_K}: compressed liquid up to saturation, the
     * horizontal two-phase segment, then superheated vapour. Above the critical pressure, one sweep in
     * temperature.
     *
     * @param pressurePa the pressure, 611.213 Pa to 100 MPa
     * @throws IllegalArgumentException if the pressure is outside that range
     */
    public static Isobar isobar(double pressurePa) {
        if (!(pressurePa >= Steam.TRIPLE_POINT_PRESSURE_PA && pressurePa <= Steam.MAX_PRESSURE_PA)) {
            throw new IllegalArgumentException("isobar pressure must lie within " + Steam.TRIPLE_POINT_PRESSURE_PA
                    + " Pa to " + Steam.MAX_PRESSURE_PA + " Pa, was " + pressurePa + " Pa");
        }
        List<Point> pts = new ArrayList<>();
        if (pressurePa >= CRITICAL_PRESSURE_PA) {
            sweep(pts, pressurePa, T_MIN_K, T_MAX_K, 2 * SINGLE_PHASE_POINTS);
            return new Isobar(pressurePa, pts);
        }
        double tSat = Steam.saturationTemperature(pressurePa);
        // Liquid points stop just short of saturation, where the (p,T) region choice is ambiguous.
        if (tSat - 0.05 > T_MIN_K) {
            sweep(pts, pressurePa, T_MIN_K, tSat - 0.05, SINGLE_PHASE_POINTS);
        }
        pts.add(new Point(Steam.statePX(pressurePa, 0.0).entropyJPerKgK(), tSat));
        pts.add(new Point(Steam.statePX(pressurePa, 1.0).entropyJPerKgK(), tSat));
        sweep(pts, pressurePa, tSat + 0.05, T_MAX_K, SINGLE_PHASE_POINTS);
        return new Isobar(pressurePa, pts);
    }

    private static void sweep(List<Point> pts, double p, double t0, double t1, int n) {
        for (int i = 0; i <= n; i++) {
            double t = t0 + (t1 - t0) * i / n;
            try {
                pts.add(new Point(Steam.entropyPT(p, t), t));
            } catch (SteamRangeException e) {
                // A point outside IF97 (e.g. liquid below the melting line at very high pressure) is left out.
            }
        }
    }

    /**
     * Groups pressures that would draw as one line: a pressure within {@code relativeGap} of the
     * previous kept one (sorted descending) is dropped.
     */
    public static List<Double> distinctPressures(List<Double> pressuresPa, double relativeGap) {
        Objects.requireNonNull(pressuresPa, "pressuresPa");
        List<Double> sorted = pressuresPa.stream().filter(p -> p != null && Double.isFinite(p) && p > 0)
                .sorted((a, b) -> Double.compare(b, a)).toList();
        List<Double> out = new ArrayList<>();
        for (double p : sorted) {
            if (out.isEmpty() || out.get(out.size() - 1) / p > 1.0 + relativeGap) {
                out.add(p);
            }
        }
        return out;
    }
}
