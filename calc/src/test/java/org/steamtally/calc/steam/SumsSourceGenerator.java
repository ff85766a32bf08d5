package org.steamtally.calc.steam;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.TreeSet;

/**
 * Writes the straight-line evaluations {@code Region1Sums}, {@code Region2Sums} and
 * {@code Region5Sums} from the (I, J, n) tables of the regions, so that the hot paths need neither
 * the loop nor the exponent switch of {@link PowerSeries#sum}.
 *
 * <p>Each generated method performs exactly the operations of {@link PowerSeries#sum} on its series,
 * in the same order: the nested Horner scheme with the same exponent steps, every power built by the
 * same squarings as {@link PowerSeries#ipow}. Its result is therefore bit for bit that of the table
 * driven sum, which {@code GeneratedSumsTest} checks at many seeded points; that test also fails
 * when a committed file differs from what this generator writes now.
 *
 * <p>Run from the {@code calc} module directory after changing a table:
 * {@code java -cp target/classes:target/test-classes org.steamtally.calc.steam.SumsSourceGenerator}.
 */
final class SumsSourceGenerator {

    static final Path SOURCE_DIRECTORY = Path.of("src/main/java/org/steamtally/calc/steam");

    /** One generated method: its name, the series it evaluates and what that series is. */
    record Entry(String method, PowerSeries series, String description) {
        boolean singleArgument() {
            return series.isPolynomialInYOnly();
        }
    }

    /** One generated class and its methods. */
    record Unit(String className, String summary, List<Entry> entries) {
    }

    private SumsSourceGenerator() {
    }

    static List<Unit> units() {
        List<Unit> units = new ArrayList<>();
        units.add(new Unit("Region1Sums", "region 1 (IAPWS R7-97(2012), eq. 7, 11 and 13 with Tables 2, 6 and 8)",
                List.of(
                        new Entry("gamma", Region1.GAMMA, "γ of eq. 7, Table 2, in x = 7.1 − π and y = τ − 1.222"),
                        new Entry("gammaX", Region1.GAMMA_X, "∂γ/∂x (= −γπ)"),
                        new Entry("gammaY", Region1.GAMMA_Y, "∂γ/∂y (= γτ)"),
                        new Entry("gammaXX", Region1.GAMMA_XX, "∂²γ/∂x² (= γππ)"),
                        new Entry("gammaXY", Region1.GAMMA_XY, "∂²γ/∂x∂y (= −γπτ)"),
                        new Entry("gammaYY", Region1.GAMMA_YY, "∂²γ/∂y² (= γττ)"),
                        new Entry("thetaPH", Region1.THETA_PH, "θ(π, η + 1) of eq. 11, Table 6"),
                        new Entry("thetaPS", Region1.THETA_PS, "θ(π, σ + 2) of eq. 13, Table 8"))));
        units.add(new Unit("Region2Sums",
                "region 2 (IAPWS R7-97(2012), eq. 15 to 17, 22 to 27 with Tables 10, 11, 20 to 22 and 25 to 27)",
                vapourEntries(Region2.GIBBS, "Table 10", "Table 11", List.of(
                        new Entry("thetaPH2a", Region2.THETA_PH_2A, "θ(π, η − 2.1) of eq. 22, Table 20"),
                        new Entry("thetaPH2b", Region2.THETA_PH_2B, "θ(π − 2, η − 2.6) of eq. 23, Table 21"),
                        new Entry("thetaPH2c", Region2.THETA_PH_2C, "θ(π + 25, η − 1.8) of eq. 24, Table 22"),
                        new Entry("thetaPS2a", Region2.THETA_PS_2A, "θ(π^(1/4), σ − 2) of eq. 25, Table 25"),
                        new Entry("thetaPS2b", Region2.THETA_PS_2B, "θ(π, 10 − σ) of eq. 26, Table 26"),
                        new Entry("thetaPS2c", Region2.THETA_PS_2C, "θ(π, 2 − σ) of eq. 27, Table 27")))));
        units.add(new Unit("Region5Sums", "region 5 (IAPWS R7-97(2012), eq. 32 to 34 with Tables 37 and 38)",
                vapourEntries(Region5.GIBBS, "Table 37", "Table 38", List.of())));
        return units;
    }

    private static List<Entry> vapourEntries(VapourGibbs gibbs, String idealTable, String residualTable,
                                             List<Entry> more) {
        List<Entry> entries = new ArrayList<>(List.of(
                new Entry("ideal", gibbs.ideal, "γ⁰ − ln π, " + idealTable + ", in τ"),
                new Entry("idealTau", gibbs.idealTau, "γ⁰τ"),
                new Entry("idealTauTau", gibbs.idealTauTau, "γ⁰ττ"),
                new Entry("residual", gibbs.residual, "γʳ, " + residualTable + ", in π and the shifted τ"),
                new Entry("residualPi", gibbs.residualPi, "γʳπ"),
                new Entry("residualTau", gibbs.residualTau, "γʳτ"),
                new Entry("residualPiPi", gibbs.residualPiPi, "γʳππ"),
                new Entry("residualPiTau", gibbs.residualPiTau, "γʳπτ"),
                new Entry("residualTauTau", gibbs.residualTauTau, "γʳττ")));
        entries.addAll(more);
        return entries;
    }

    public static void main(String[] args) throws IOException {
        for (Unit unit : units()) {
            Files.writeString(SOURCE_DIRECTORY.resolve(unit.className() + ".java"), source(unit),
                    StandardCharsets.UTF_8);
        }
    }

    static String source(Unit unit) {
        StringBuilder out = new StringBuilder();
        out.append("package org.steamtally.calc.steam;\n\n");
        out.append("/**\n");
        out.append(" * Straight-line evaluations of the power series of ").append(unit.summary()).append(".\n");
        out.append(" *\n");
        out.append(" * <p>Generated by {@code SumsSourceGenerator} (calc/src/test) from the coefficient tables, which\n");
        out.append(" * remain the source of truth; do not edit by hand. Each method does the operations of\n");
        out.append(" * {@link PowerSeries#sum} in the same order and so returns the same double;\n");
        out.append(" * {@code GeneratedSumsTest} checks that and that this file is up to date.\n");
        out.append(" */\n");
        out.append("final class ").append(unit.className()).append(" {\n\n");
        out.append("    private ").append(unit.className()).append("() {\n    }\n");
        for (Entry entry : unit.entries()) {
            out.append('\n');
            method(out, entry);
        }
        out.append("}\n");
        return out.toString();
    }

    private static void method(StringBuilder out, Entry entry) {
        PowerSeries s = entry.series();
        int[] groupEnd = s.groupEnds();
        int[] xStep = s.xSteps();
        int[] yStep = s.ySteps();
        int[] yMin = s.groupYMins();
        double[] coef = s.coefficients();
        int xMin = s.smallestI();

        TreeSet<Integer> xPowers = new TreeSet<>();
        TreeSet<Integer> yPowers = new TreeSet<>();
        TreeSet<Integer> xInvPowers = new TreeSet<>();
        TreeSet<Integer> yInvPowers = new TreeSet<>();
        for (int g = 1; g < groupEnd.length; g++) {
            xPowers.add(xStep[g]);
        }
        for (int k = 0; k < coef.length; k++) {
            if (yStep[k] > 0) {
                yPowers.add(yStep[k]);
            }
        }
        for (int g = 0; g < groupEnd.length; g++) {
            if (yMin[g] > 0) {
                yPowers.add(yMin[g]);
            } else if (yMin[g] < 0) {
                yInvPowers.add(-yMin[g]);
            }
        }
        if (xMin > 0) {
            xPowers.add(xMin);
        } else if (xMin < 0) {
            xInvPowers.add(-xMin);
        }

        out.append("    /** ").append(entry.description()).append(". */\n");
        if (entry.singleArgument()) {
            out.append("    static double ").append(entry.method()).append("(double y) {\n");
        } else {
            out.append("    static double ").append(entry.method()).append("(double x, double y) {\n");
        }
        powers(out, "x", xPowers);
        powers(out, "y", yPowers);
        if (!xInvPowers.isEmpty()) {
            out.append("        double xi = 1.0 / x;\n");
            powers(out, "xi", xInvPowers);
        }
        if (s.needsYInverse()) {
            out.append("        double yi = 1.0 / y;\n");
            powers(out, "yi", yInvPowers);
        }
        int k = 0;
        for (int g = 0; g < groupEnd.length; g++) {
            String name = "g" + g;
            out.append("        double ").append(name).append(" = ").append(literal(coef[k++])).append(";\n");
            while (k < groupEnd[g]) {
                out.append("        ").append(name).append(" = ").append(name);
                if (yStep[k] > 0) {
                    out.append(" * ").append(power("y", yStep[k]));
                }
                out.append(" + ").append(literal(coef[k])).append(";\n");
                k++;
            }
            if (yMin[g] != 0) {
                out.append("        ").append(name).append(" *= ")
                        .append(yMin[g] > 0 ? power("y", yMin[g]) : power("yi", -yMin[g])).append(";\n");
            }
            if (g == 0) {
                out.append("        double sum = g0;\n");
            } else {
                out.append("        sum = sum * ").append(power("x", xStep[g])).append(" + ").append(name)
                        .append(";\n");
            }
        }
        if (groupEnd.length == 0) {
            out.append("        double sum = 0.0;\n");
        }
        if (xMin != 0) {
            out.append("        sum *= ").append(xMin > 0 ? power("x", xMin) : power("xi", -xMin)).append(";\n");
        }
        out.append("        return sum;\n");
        out.append("    }\n");
    }

    /**
     * Declares b^e for each wanted e as {@link PowerSeries#ipow} builds it: the squares b², b⁴, b⁸, ...
     * and, for other exponents, the product of the squares of its set bits, lowest first.
     */
    private static void powers(StringBuilder out, String base, TreeSet<Integer> wanted) {
        if (wanted.isEmpty()) {
            return;
        }
        int highest = wanted.last();
        for (int square = 2; square <= highest; square *= 2) {
            String previous = square == 2 ? base : base + (square / 2);
            out.append("        double ").append(base).append(square).append(" = ")
                    .append(previous).append(" * ").append(previous).append(";\n");
        }
        for (int e : wanted) {
            if (Integer.bitCount(e) > 1) {
                StringBuilder product = new StringBuilder();
                for (int bit = 0; bit < 31; bit++) {
                    if ((e & (1 << bit)) != 0) {
                        if (product.length() > 0) {
                            product.append(" * ");
                        }
                        product.append(bit == 0 ? base : base + (1 << bit));
                    }
                }
                out.append("        double ").append(base).append(e).append(" = ").append(product).append(";\n");
            }
        }
    }

    private static String power(String base, int e) {
        return e == 1 ? base : base + e;
    }

    private static String literal(double value) {
        return Double.toString(value).toLowerCase(Locale.ROOT);
    }
}
