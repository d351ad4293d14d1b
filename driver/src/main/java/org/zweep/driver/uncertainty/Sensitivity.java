package org.zweep.driver.uncertainty;

import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;

/**
 * Sensitivity coefficients (∂p/∂R, ∂p/∂X) of every derived parameter at one impedance: the
 * Jacobian row of the law of propagation of uncertainty (JCGM 100:2008, 5.2.2). Where |X| has no
 * derivative (X = 0) its slope is taken as 1, the conservative choice; where a parameter is
 * infinite the coefficients are infinite and so is its linear uncertainty.
 */
final class Sensitivity {
    private static final double DEG_PER_RAD = 180.0 / Math.PI;

    private Sensitivity() {
    }

    /** {∂p/∂R, ∂p/∂X} in the parameter's SI unit per ohm. */
    static double[] of(DerivedParameter p, Impedance z) {
        double r = z.resistanceOhm();
        double x = z.reactanceOhm();
        double w = z.omega();
        double m2 = r * r + x * x;
        double m = Math.sqrt(m2);
        double m4 = m2 * m2;
        double sx = x >= 0 ? 1.0 : -1.0; // slope of |X|, conservative 1 at X = 0
        double ax = Math.abs(x);
        double b = -x / m2;
        switch (p) {
            case FREQUENCY:
                return new double[] {0, 0};
            case R:
            case RS:
                return new double[] {1, 0};
            case X:
                return new double[] {0, 1};
            case Z:
                return new double[] {r / m, x / m};
            case THETA:
                return new double[] {-x / m2 * DEG_PER_RAD, r / m2 * DEG_PER_RAD};
            case DELTA:
                return new double[] {ax / m2 * DEG_PER_RAD, -r * sx / m2 * DEG_PER_RAD};
            case Q:
                return new double[] {-ax / (r * r), sx / r};
            case D:
                return new double[] {1 / ax, -r * sx / (x * x)};
            case G:
                return new double[] {(x * x - r * r) / m4, -2 * r * x / m4};
            case B:
                return dB(r, x, m4);
            case ADMITTANCE:
                return new double[] {-r / (m2 * m), -x / (m2 * m)};
            case CS:
                return new double[] {0, 1 / (w * x * x)};
            case LS:
                return new double[] {0, 1 / w};
            case CP: {
                double[] g = dB(r, x, m4);
                return new double[] {g[0] / w, g[1] / w};
            }
            case LP: {
                // Lp = −1/(ωB): ∂Lp = ∂B/(ωB²)
                double[] g = dB(r, x, m4);
                return new double[] {g[0] / (w * b * b), g[1] / (w * b * b)};
            }
            case RP: {
                // Rp = |Z|²/R: ∂Rp/∂R = 1 − X²/R², ∂Rp/∂X = 2X/R
                return new double[] {1 - x * x / (r * r), 2 * x / r};
            }
            default:
                throw new IllegalArgumentException("no sensitivity for " + p);
        }
    }

    private static double[] dB(double r, double x, double m4) {
        return new double[] {2 * r * x / m4, (x * x - r * r) / m4};
    }
}
