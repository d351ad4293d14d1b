package org.zweep.runner.compensation;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Function;
import org.apache.commons.math3.complex.Complex;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Compensation;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.driver.uncertainty.UncertainImpedance;
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
    private final UncertainImpedance loadStated;
    private final Map<Double, Compensation> cache = new HashMap<>();

    /**
     * With the load standard's value taken as exact.
     *
     * @param data the standards' readings (OPEN, SHORT, or both, optionally with LOAD)
     * @param source where the data came from (for messages)
     * @param loadKnownOhm the load standard's known impedance; {@code null} without LOAD
     */
    public HostCorrector(CompensationData data, String source, Impedance loadKnownOhm) {
        this(data, source, loadKnownOhm == null ? null : UncertainImpedance.exact(loadKnownOhm), true);
    }

    /**
     * A corrector whose uncertainty includes the load standard's stated uncertainty.
     *
     * @param data the standards' readings (OPEN, SHORT, or both, optionally with LOAD)
     * @param source where the data came from (for messages)
     * @param loadStated the load standard's stated value with its standard uncertainty; {@code null} without LOAD
     */
    public static HostCorrector withStatedLoad(CompensationData data, String source, UncertainImpedance loadStated) {
        return new HostCorrector(data, source, loadStated, true);
    }

    private HostCorrector(CompensationData data, String source, UncertainImpedance loadStated, boolean stated) {
        this.data = data;
        this.source = source;
        this.loadStated = loadStated;
        this.loadKnown = loadStated == null ? null : loadStated.value().toComplex();
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

    /**
     * The standard uncertainty of the corrected value of {@code raw}: the raw reading's own,
     * {@code rawU}, through ∂Z/∂Zm, plus the uncertainty of each standard's reading at that
     * frequency ({@code standardU} of the stored or interpolated reading) through ∂Z/∂Z_standard,
     * and, with open/short/load, the stated uncertainty of the load standard's value through
     * ∂Z/∂Z_std = Z/Z_std (see {@link #loadValueContribution}), all taken as independent (JCGM
     * 100:2008, 5.1.2). The other derivatives are central differences of the correction itself.
     *
     * @param standardU the standard uncertainty of a standard's reading; null when unknown
     * @return the corrected value's uncertainty; null when {@code rawU} or a standard's is unknown
     */
    public UncertainImpedance uncertainty(Reading raw, UncertainImpedance rawU,
            Function<Impedance, UncertainImpedance> standardU) {
        if (rawU == null || raw.status() != ReadingStatus.OK
                || raw.setting().quantity() != MeasuredQuantity.IMPEDANCE) {
            return null;
        }
        double f = raw.setting().frequencyHz();
        Complex zm = new Complex(raw.real(), raw.imaginary());
        Complex[] std = standards(f);
        Complex z = build(std).correct(zm);
        Impedance out = new Impedance(f, z.getReal(), z.getImaginary());
        Complex hm = new Complex(step(zm), 0);
        Complex dm = build(std).correct(zm.add(hm)).subtract(build(std).correct(zm.subtract(hm)))
                .divide(hm.multiply(2));
        UncertainImpedance total = rawU.through(out, dm);
        for (int k = 0; k < std.length; k++) {
            if (std[k] == null || std[k].isInfinite()) {
                continue; // an open beyond the meter's range: no reading, so no reading uncertainty to carry
            }
            UncertainImpedance uk = standardU.apply(new Impedance(f, std[k].getReal(), std[k].getImaginary()));
            if (uk == null) {
                return null;
            }
            Complex h = new Complex(step(std[k]), 0);
            Complex[] plus = std.clone();
            Complex[] minus = std.clone();
            plus[k] = std[k].add(h);
            minus[k] = std[k].subtract(h);
            Complex dk = build(plus).correct(zm).subtract(build(minus).correct(zm)).divide(h.multiply(2));
            total = total.plus(uk.through(out, dk));
        }
        if (std[0] != null && std[1] != null && std[2] != null) {
            total = total.plus(loadValueContribution(out, loadStated));
        }
        return total;
    }

    /**
     * The contribution of the load standard's stated uncertainty to a value {@code corrected}
     * by open/short/load: the corrected value is proportional to the load standard's value
     * Z_std (the correction is Z = Z_std·F(Zm, Zo, Zs, Zl)), so ∂Z/∂Z_std = Z/Z_std exactly, and
     * the load's relative uncertainty passes one to one to every corrected value. Zero for an
     * exact load; also right for a meter that corrects itself with the same formula.
     */
    public static UncertainImpedance loadValueContribution(Impedance corrected, UncertainImpedance loadStated) {
        if (loadStated == null) {
            return UncertainImpedance.exact(corrected);
        }
        Complex z = corrected.toComplex();
        return loadStated.through(corrected, z.divide(loadStated.value().toComplex()));
    }

    /**
     * {@inheritDoc}
     *
     * <p>Here: {@link #uncertainty(Reading, UncertainImpedance, Function)} with each standard's
     * reading judged by {@code accuracy} at the drive level and integration time the standards
     * were measured with.
     */
    @Override
    public UncertainImpedance uncertainty(Reading raw, UncertainImpedance rawU,
            org.zweep.driver.uncertainty.MeterAccuracy accuracy) {
        if (accuracy == null) {
            return null;
        }
        CompensationData.Info info = data.info();
        boolean current = "A".equals(info.driveMode());
        return uncertainty(raw, rawU,
                z -> accuracy.uncertainty(z, info.level(), current, info.integrationS()).orElse(null));
    }

    private static double step(Complex z) {
        return 1e-6 * Math.max(z.abs(), 1e-9);
    }

    /** The open, short and load readings at {@code f} (null for a standard not stored). */
    private Complex[] standards(double f) {
        return new Complex[] {
            has(CorrectionStandard.OPEN) ? openAt(f) : null,
            has(CorrectionStandard.SHORT) ? at(CorrectionStandard.SHORT, f) : null,
            has(CorrectionStandard.LOAD) ? at(CorrectionStandard.LOAD, f) : null};
    }

    private Compensation build(double f) {
        return build(standards(f));
    }

    private Compensation build(Complex[] std) {
        Complex zo = std[0];
        Complex zs = std[1];
        Complex yo = zo == null ? null : zo.isInfinite() ? Complex.ZERO : zo.reciprocal();
        boolean open = zo != null;
        boolean shrt = zs != null;
        boolean load = std[2] != null;
        if (open && shrt && load) {
            if (loadKnown == null) {
                throw new InvalidInputException(source + ": load data but no known load value in the sequence");
            }
            return Compensation.openShortLoadFromAdmittance(yo, zs, std[2], loadKnown);
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

    /** The OPEN's impedance at {@code f}; {@link Complex#INF} where its admittance is taken as 0. */
    private Complex openAt(double f) {
        Complex y = openAdmittanceAt(f);
        return y.equals(Complex.ZERO) ? Complex.INF : y.reciprocal();
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
