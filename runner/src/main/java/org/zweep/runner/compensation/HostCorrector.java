package org.zweep.runner.compensation;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Compensation;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.runner.engine.ReadingCorrector;

/**
 * Corrects readings with stored standards: at a stored frequency the stored readings are used as
 * they are (an OPEN beyond the meter's range as admittance 0); between two stored frequencies each standard is interpolated linearly in frequency
 * (the open as an admittance G + jB, the short and load as impedances R + jX, the quantities
 * that the usual residual models make linear in frequency); outside the stored span it refuses.
 * Not thread-safe (caches one correction per frequency).
 */
public final class HostCorrector implements ReadingCorrector {
    private static final double SAME = 1e-9;

    private final CompensationData data;
    private final String source;
    private final Complex loadKnown;
    private final Map<Double, Compensation> cache = new HashMap<>();

    /**
     * @param data the standards' readings (OPEN, SHORT, or both, optionally with LOAD)
     * @param source where the data came from (for messages)
     * @param loadKnownOhm the load standard's known impedance; {@code null} without LOAD
     */
    public HostCorrector(CompensationData data, String source, Impedance loadKnownOhm) {
        this.data = data;
        this.source = source;
        this.loadKnown = loadKnownOhm == null ? null : loadKnownOhm.toComplex();
    }

    /**
     * Checks that every frequency in {@code frequenciesHz} lies within the stored span.
     *
     * @throws InvalidInputException for the first one that would need extrapolation
     */
    public void checkCovers(List<Double> frequenciesHz) {
        for (double f : frequenciesHz) {
            compensationAt(f);
        }
    }

    @Override
    public Reading correct(Reading raw) {
        if (raw.status() != ReadingStatus.OK || raw.setting().quantity() != MeasuredQuantity.IMPEDANCE) {
            return raw;
        }
        Compensation c = compensationAt(raw.setting().frequencyHz());
        Complex z = c.correct(new Complex(raw.real(), raw.imaginary()));
        return new Reading(raw.setting(), z.getReal(), z.getImaginary(), raw.status(), raw.timestamp());
    }

    Compensation compensationAt(double f) {
        Compensation c = cache.get(f);
        if (c == null) {
            c = build(f);
            cache.put(f, c);
        }
        return c;
    }

    private Compensation build(double f) {
        boolean open = has(CorrectionStandard.OPEN);
        boolean shrt = has(CorrectionStandard.SHORT);
        boolean load = has(CorrectionStandard.LOAD);
        Complex yo = open ? openAdmittanceAt(f) : null;
        Complex zs = shrt ? at(CorrectionStandard.SHORT, f) : null;
        if (open && shrt && load) {
            if (loadKnown == null) {
                throw new InvalidInputException(source + ": load data but no known load value in the sequence");
            }
            return Compensation.openShortLoadFromAdmittance(yo, zs, at(CorrectionStandard.LOAD, f), loadKnown);
        }
        if (open && shrt) {
            return Compensation.openShortFromAdmittance(yo, zs);
        }
        if (open) {
            return Compensation.fromResiduals(Complex.ZERO, yo);
        }
        if (shrt) {
            return Compensation.fromResiduals(zs, Complex.ZERO);
        }
        throw new InvalidInputException(source + ": holds no OPEN or SHORT data");
    }

    /**
     * The OPEN's admittance at {@code f}, interpolated linearly between stored points; 0 where the
     * meter read the open as beyond its range (an admittance below what it can see).
     */
    private Complex openAdmittanceAt(double f) {
        List<CompensationData.Entry> e = span(CorrectionStandard.OPEN, f);
        for (int i = 0; i < e.size(); i++) {
            CompensationData.Entry a = e.get(i);
            if (Math.abs(a.frequencyHz() - f) <= SAME * f) {
                return admittance(a);
            }
            if (i + 1 < e.size() && e.get(i + 1).frequencyHz() > f) {
                CompensationData.Entry b = e.get(i + 1);
                double t = (f - a.frequencyHz()) / (b.frequencyHz() - a.frequencyHz());
                return admittance(a).multiply(1 - t).add(admittance(b).multiply(t));
            }
        }
        return admittance(e.get(e.size() - 1));
    }

    private static Complex admittance(CompensationData.Entry e) {
        return e.overRange() ? Complex.ZERO : new Complex(e.rOhm(), e.xOhm()).reciprocal();
    }

    /** The entries of {@code s}, once {@code f} is known to lie within their span. */
    private List<CompensationData.Entry> span(CorrectionStandard s, double f) {
        List<CompensationData.Entry> e = data.of(s);
        double lo = e.get(0).frequencyHz();
        double hi = e.get(e.size() - 1).frequencyHz();
        if (f < lo * (1 - SAME) || f > hi * (1 + SAME)) {
            throw new InvalidInputException(source + ": the " + s + " data covers " + lo + " Hz to " + hi
                    + " Hz but the sweep needs " + f + " Hz; compensation is never extrapolated: measure the"
                    + " standards over the sweep's range (or lower the reuse age)");
        }
        return e;
    }

    private boolean has(CorrectionStandard s) {
        return data.entries().stream().anyMatch(e -> e.standard() == s);
    }

    /** The SHORT's or LOAD's impedance at {@code f}, interpolated linearly between stored points. */
    private Complex at(CorrectionStandard s, double f) {
        List<CompensationData.Entry> e = span(s, f);
        for (int i = 0; i < e.size(); i++) {
            CompensationData.Entry a = e.get(i);
            if (Math.abs(a.frequencyHz() - f) <= SAME * f) {
                return new Complex(a.rOhm(), a.xOhm());
            }
            if (i + 1 < e.size() && e.get(i + 1).frequencyHz() > f) {
                CompensationData.Entry b = e.get(i + 1);
                double t = (f - a.frequencyHz()) / (b.frequencyHz() - a.frequencyHz());
                return new Complex(a.rOhm(), a.xOhm()).multiply(1 - t).add(new Complex(b.rOhm(), b.xOhm()).multiply(t));
            }
        }
        CompensationData.Entry last = e.get(e.size() - 1);
        return new Complex(last.rOhm(), last.xOhm());
    }
}
