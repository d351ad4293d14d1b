package org.zweep.runner.analysis;

import java.util.List;
import org.zweep.driver.impedance.Impedance;

/**
 * Closed-form first guesses of a circuit's parameters from the data, so no
 * user guess is needed. Every value returned is positive and finite.
 */
final class StartValues {
    /** A minor element nobody can see is started where it would resonate this far above the sweep. */
    private static final double UNSEEN_FACTOR = 10;

    private StartValues() {
    }

    /**
     * @param ascending the sweep sorted by frequency
     * @param srfDataHz the measured reactance's zero crossing, or NaN
     */
    static double[] of(CircuitModel model, List<Impedance> ascending, double srfDataHz) {
        Impedance low = ascending.get(0);
        Impedance high = ascending.get(ascending.size() - 1);
        double wLow = low.omega();
        double wHigh = high.omega();
        double wUnseen = 2 * Math.PI * UNSEEN_FACTOR * high.frequencyHz();
        double wSrf = 2 * Math.PI * srfDataHz;
        Impedance minZ = ascending.stream().min(java.util.Comparator.comparingDouble(Impedance::magnitudeOhm)).get();
        double[] p = new double[model.keys().size()];
        switch (model) {
            case CAPACITOR, CAPACITOR_LEAKAGE, CAPACITOR_TAN_DELTA -> {
                double c = low.reactanceOhm() < 0 ? low.seriesCapacitanceF() : 1 / (wLow * low.magnitudeOhm());
                double esr = positiveOr(minZ.resistanceOhm(), 1e-3 * minZ.magnitudeOhm());
                double esl;
                if (Double.isFinite(srfDataHz)) {
                    esl = 1 / (wSrf * wSrf * c);
                } else {
                    double fromHigh = (high.reactanceOhm() + 1 / (wHigh * c)) / wHigh;
                    esl = positiveOr(fromHigh, 1 / (wUnseen * wUnseen * c));
                }
                p[0] = c;
                p[1] = esr;
                p[2] = esl;
                double extra = low.resistanceOhm() - esr;
                if (model == CircuitModel.CAPACITOR_LEAKAGE) {
                    p[3] = extra > 0 ? 1 / (wLow * wLow * c * c * extra) : 1e3 * low.magnitudeOhm();
                } else if (model == CircuitModel.CAPACITOR_TAN_DELTA) {
                    p[3] = extra > 0 ? extra * wLow * c : 1e-4;
                }
            }
            case INDUCTOR, INDUCTOR_CORE_LOSS -> {
                double l = low.reactanceOhm() > 0 ? low.seriesInductanceH() : low.magnitudeOhm() / wLow;
                double r = positiveOr(low.resistanceOhm(), 1e-3 * low.magnitudeOhm());
                double cp;
                if (Double.isFinite(srfDataHz)) {
                    cp = 1 / (wSrf * wSrf * l);
                } else {
                    double lEff = high.seriesInductanceH();
                    cp = lEff > l ? (1 - l / lEff) / (wHigh * wHigh * l) : 1 / (wUnseen * wUnseen * l);
                }
                p[0] = l;
                p[1] = r;
                p[2] = cp;
                if (model == CircuitModel.INDUCTOR_CORE_LOSS) {
                    double extra = high.resistanceOhm() - r;
                    p[3] = extra > 0 && !Double.isFinite(srfDataHz)
                            ? (wHigh * l) * (wHigh * l) / extra
                            : 1e3 * Math.max(low.magnitudeOhm(), wHigh * l);
                }
            }
            case RESISTOR -> {
                double r = positiveOr(low.resistanceOhm(), low.magnitudeOhm());
                double x = high.seriesInductanceH();
                double tau = 1 / wUnseen;
                p[0] = r;
                p[1] = x > 0 ? x : r * tau * 0.1;
                p[2] = x < 0 ? -x / (r * r) : tau / r * 0.1;
            }
            default -> throw new IllegalStateException(model.toString());
        }
        return p;
    }

    private static double positiveOr(double value, double fallback) {
        return value > 0 && Double.isFinite(value) ? value : fallback;
    }
}
