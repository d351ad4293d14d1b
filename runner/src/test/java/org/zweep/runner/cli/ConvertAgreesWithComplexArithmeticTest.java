package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.math.BigDecimal;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.complex.ComplexUtils;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/**
 * {@code zweep convert} against an independent calculation: for random inputs of every pair, the
 * impedance is built with Commons Math complex arithmetic straight from the circuit (R in series
 * with 1/(jωC), 1/Rp in parallel with jωC, …) and every contract field is derived from that complex
 * Z and Y = 1/Z by its textbook definition (Alexander & Sadiku, Fundamentals of Electric Circuits, §9.5,
 * from memory). Agreement must be 1e-9
 * relative (issue 2, "Done when"). Most cases call the factory in process; every
 * {@value #CLI_EVERY}th runs the whole command, whose parsing of an exact decimal and whose JSON
 * (shortest round-trip decimal) add no error.
 */
class ConvertAgreesWithComplexArithmeticTest {

    private static final int CASES = 1_000;
    /** Every this many cases the whole command runs (parsing, conversion, JSON); the rest call the factory. */
    private static final int CLI_EVERY = 50;
    private static final double RELATIVE = 1e-9;

    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {"r/x", "z/theta", "cs/d", "cp/d", "ls/q", "lp/q", "cs/esr", "cp/rp", "ls/rs", "lp/rp"})
    void everyContractFieldAgreesForRandomInputs(String pair) throws Exception {
        SplittableRandom random = new SplittableRandom(pair.hashCode() * 31L + 2);
        for (int i = 0; i < CASES; i++) {
            double f = logUniform(random, 1, 1e8);
            double w = 2 * Math.PI * f;
            double c = logUniform(random, 1e-12, 1e-2);
            double l = logUniform(random, 1e-9, 10);
            double res = logUniform(random, 1e-3, 1e9);
            double d = logUniform(random, 1e-5, 10);
            double q = logUniform(random, 0.1, 1e4);
            String[] parts = pair.split("/");
            double a;
            double b;
            Complex z;
            switch (pair) {
                case "r/x":
                    a = random.nextDouble(-1e3, 1e3);
                    b = random.nextDouble(-1e3, 1e3);
                    z = new Complex(a, b);
                    break;
                case "z/theta":
                    a = logUniform(random, 1e-3, 1e9);
                    b = random.nextDouble(-179.9, 179.9);
                    z = ComplexUtils.polar2Complex(a, Math.toRadians(b));
                    break;
                case "cs/d": {
                    a = c;
                    b = d;
                    Complex xc = Complex.I.multiply(w * c).reciprocal();
                    z = xc.add(d * xc.abs());
                    break;
                }
                case "cp/d": {
                    a = c;
                    b = d;
                    Complex bc = Complex.I.multiply(w * c);
                    z = bc.add(d * bc.abs()).reciprocal();
                    break;
                }
                case "ls/q": {
                    a = l;
                    b = q;
                    Complex xl = Complex.I.multiply(w * l);
                    z = xl.add(xl.abs() / q);
                    break;
                }
                case "lp/q": {
                    a = l;
                    b = q;
                    Complex bl = Complex.I.multiply(w * l).reciprocal();
                    z = bl.add(bl.abs() / q).reciprocal();
                    break;
                }
                case "cs/esr":
                    a = c;
                    b = res * 1e-6;
                    z = Complex.I.multiply(w * c).reciprocal().add(b);
                    break;
                case "cp/rp":
                    a = c;
                    b = res;
                    z = Complex.I.multiply(w * c).add(1 / res).reciprocal();
                    break;
                case "ls/rs":
                    a = l;
                    b = res * 1e-6;
                    z = Complex.I.multiply(w * l).add(b);
                    break;
                case "lp/rp":
                    a = l;
                    b = res;
                    z = Complex.I.multiply(w * l).reciprocal().add(1 / res).reciprocal();
                    break;
                default:
                    throw new IllegalArgumentException(pair);
            }
            Map<String, Double> expected = expectedFields(f, z);
            String where = pair + " case " + i + " for " + exact(a) + ", " + exact(b) + " at " + exact(f) + " Hz: ";
            Map<String, Double> inProcess = DerivedParameter.contractValues(factory(pair, f, a, b));
            for (Map.Entry<String, Double> e : expected.entrySet()) {
                assertEquals(e.getValue(), inProcess.get(e.getKey()), Math.abs(e.getValue()) * RELATIVE,
                        where + e.getKey());
            }
            if (i % CLI_EVERY == 0) {
                JsonNode node = ConvertCommandTest.json("convert", "--frequency", exact(f) + " Hz",
                        "--" + parts[0], exact(a), "--" + parts[1], exact(b));
                for (Map.Entry<String, Double> e : expected.entrySet()) {
                    JsonNode actual = node.get(e.getKey());
                    assertTrue(actual != null && actual.isNumber(), where + e.getKey());
                    assertEquals(e.getValue(), actual.asDouble(), Math.abs(e.getValue()) * RELATIVE,
                            where + e.getKey() + " (command line)");
                }
            }
        }
    }

    private static Impedance factory(String pair, double f, double a, double b) {
        switch (pair) {
            case "r/x":
                return Impedance.fromRX(f, a, b);
            case "z/theta":
                return Impedance.fromPolar(f, a, b);
            case "cs/d":
                return Impedance.fromCsD(f, a, b);
            case "cp/d":
                return Impedance.fromCpD(f, a, b);
            case "ls/q":
                return Impedance.fromLsQ(f, a, b);
            case "lp/q":
                return Impedance.fromLpQ(f, a, b);
            case "cs/esr":
                return Impedance.fromCsEsr(f, a, b);
            case "cp/rp":
                return Impedance.fromCpRp(f, a, b);
            case "ls/rs":
                return Impedance.fromLsRs(f, a, b);
            case "lp/rp":
                return Impedance.fromLpRp(f, a, b);
            default:
                throw new IllegalArgumentException(pair);
        }
    }

    /** Every contract field from the complex Z by its definition (Q = |X|/R, D = R/|X|, Y = 1/Z, Cs = −1/(ωX), …). */
    private static Map<String, Double> expectedFields(double f, Complex z) {
        double w = 2 * Math.PI * f;
        Complex y = z.reciprocal();
        Complex jw = Complex.I.multiply(w);
        double theta = Math.toDegrees(z.getArgument());
        Map<String, Double> m = new LinkedHashMap<>();
        m.put("frequency_hz", f);
        m.put("r_ohm", z.getReal());
        m.put("x_ohm", z.getImaginary());
        m.put("z_ohm", z.abs());
        m.put("theta_deg", theta);
        // δ from tan δ = D; 90° − |θ| itself would cancel to no digits near |θ| = 90°
        m.put("delta_deg", Math.toDegrees(Math.atan(z.getReal() / Math.abs(z.getImaginary()))));
        m.put("q", Math.abs(z.getImaginary()) / z.getReal());
        m.put("d", z.getReal() / Math.abs(z.getImaginary()));
        m.put("g_s", y.getReal());
        m.put("b_s", y.getImaginary());
        // series: jX = 1/(jωCs) and jX = jωLs; parallel: jB = jωCp and jB = 1/(jωLp)
        m.put("cs_f", jw.multiply(new Complex(0, z.getImaginary())).reciprocal().getReal());
        m.put("cp_f", y.getImaginary() / w);
        m.put("ls_h", new Complex(0, z.getImaginary()).divide(jw).getReal());
        m.put("lp_h", jw.multiply(new Complex(0, y.getImaginary())).reciprocal().getReal());
        m.put("rs_ohm", z.getReal());
        m.put("rp_ohm", 1 / y.getReal());
        return m;
    }

    private static double logUniform(SplittableRandom random, double low, double high) {
        return Math.exp(random.nextDouble(Math.log(low), Math.log(high)));
    }

    /** The double's exact decimal expansion, so the command parses back exactly this double. */
    private static String exact(double v) {
        return new BigDecimal(v).toString();
    }
}
