package org.zweep.simulator.bench;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.function.BiFunction;
import org.apache.commons.math3.complex.Complex;

/**
 * The simulated meter's own fixture correction: raw readings of the open, short and load
 * standards taken at a set of frequencies, interpolated between them, and applied to a raw
 * reading.
 *
 * <ul>
 *   <li>Open and/or short (the series residual Zs on the meter side, the stray admittance Yo
 *       across the device): {@code Zdut = (Zm − Zs) / (1 − (Zm − Zs)·Yo)} with the exact
 *       {@code Yo = 1/(Zo − Zs)}; a missing short counts as Zs = 0, a missing open as Yo = 0.</li>
 *   <li>Open, short and load (the general three-standard bilinear map, exact for any linear
 *       fixture): {@code Zdut = Zstd·(Zo − Zsm)(Zm − Zs) / ((Zsm − Zs)(Zo − Zm))}, written with
 *       {@code 1/Zo} so that an open that overloads (infinite impedance) works.</li>
 *   <li>A load without both open and short is kept but not used.</li>
 * </ul>
 *
 * <p>Interpolation is linear in frequency, on the stray admittance 1/(Zo − Zs) and on the short's
 * impedance (exact for a residual R + jωL and a stray G + jωC); for the three-standard map, on
 * 1/Zo and on the load's reading. Outside the acquired
 * frequencies the nearest end value is used. An open reading that overloaded counts as an
 * infinite impedance.
 *
 * <p>Immutable and thread-safe; the {@code with…} methods return a copy.
 */
public final class MeterCorrection {

    /** The three standards. */
    public enum Standard {
        OPEN,
        SHORT,
        LOAD
    }

    /**
     * One raw reading of a standard.
     *
     * @param frequencyHz frequency in Hz
     * @param realOhm real part of the raw reading in ohms (ignored when overloaded)
     * @param imaginaryOhm imaginary part in ohms (ignored when overloaded)
     * @param overload the reading overloaded
     */
    public record Sample(double frequencyHz, double realOhm, double imaginaryOhm,
            boolean overload) {
    }

    /**
     * What {@link #acquire} measured.
     *
     * @param samples one sample per frequency, in the order asked
     * @param durationS the total time the measurements take on a real meter, in s
     */
    public record Acquisition(List<Sample> samples, double durationS) {
        public Acquisition {
            samples = List.copyOf(samples);
        }
    }

    private static final MeterCorrection NONE =
            new MeterCorrection(new EnumMap<>(Standard.class), new Complex(100, 0));

    private final Map<Standard, Table> tables;
    private final Complex loadReference;

    private MeterCorrection(Map<Standard, Table> tables, Complex loadReference) {
        this.tables = tables;
        this.loadReference = loadReference;
    }

    /** No standards acquired; the load reference is 100 Ω. */
    public static MeterCorrection none() {
        return NONE;
    }

    /**
     * Measures whatever the bench's slot holds now at each frequency, with the other settings of
     * {@code template} (its {@code voltageRatio} flag is ignored). Point {@code i} draws its noise
     * from key {@code template.noiseKey() + i}. Does not sleep.
     */
    public static Acquisition acquire(Bench bench, double[] frequenciesHz, PointRequest template) {
        List<Sample> samples = new ArrayList<>();
        double duration = 0;
        for (int i = 0; i < frequenciesHz.length; i++) {
            PointRequest r = PointRequest.at(frequenciesHz[i]).drive(template.drive(), template.driveLevelRms())
                    .bias(template.bias(), template.biasValue(), template.biasOn()).averages(template.averages())
                    .apertureS(template.apertureS()).rangeUpperOhm(template.rangeUpperOhm())
                    .noiseKey(template.noiseKey() + i).build();
            PointResult p = bench.measure(r);
            samples.add(new Sample(frequenciesHz[i], p.real(), p.imaginary(), p.overload()));
            duration += p.durationS();
        }
        return new Acquisition(samples, duration);
    }

    /**
     * Log-spaced frequencies covering the meter's range, for acquiring standards.
     *
     * @param perDecade points per decade, at least 1
     */
    public static double[] frequencies(MeterLimits limits, int perDecade) {
        if (perDecade < 1) {
            throw new IllegalArgumentException("perDecade must be at least 1");
        }
        double lo = Math.log10(limits.minFrequencyHz());
        double hi = Math.log10(limits.maxFrequencyHz());
        int n = Math.max(2, (int) Math.ceil((hi - lo) * perDecade) + 1);
        double[] f = new double[n];
        for (int i = 0; i < n; i++) {
            f[i] = Math.pow(10, lo + (hi - lo) * i / (n - 1));
        }
        f[0] = limits.minFrequencyHz();
        f[n - 1] = limits.maxFrequencyHz();
        return f;
    }

    /**
     * This correction with {@code standard}'s readings replaced.
     *
     * @param samples at least one; a repeated frequency keeps the last sample
     * @throws IllegalArgumentException if empty, or a short or load sample overloaded
     */
    public MeterCorrection with(Standard standard, List<Sample> samples) {
        if (samples.isEmpty()) {
            throw new IllegalArgumentException("no " + name(standard) + " readings");
        }
        TreeMap<Double, Complex> points = new TreeMap<>();
        for (Sample s : samples) {
            Complex value;
            if (standard == Standard.OPEN) {
                Complex z = new Complex(s.realOhm(), s.imaginaryOhm());
                value = s.overload() || z.isInfinite() ? Complex.ZERO : z.reciprocal();
            } else {
                if (s.overload()) {
                    throw new IllegalArgumentException("the " + name(standard)
                            + " reading overloaded at " + s.frequencyHz() + " Hz");
                }
                value = new Complex(s.realOhm(), s.imaginaryOhm());
            }
            if (value.isNaN() || value.isInfinite()) {
                throw new IllegalArgumentException("the " + name(standard) + " reading at "
                        + s.frequencyHz() + " Hz is not a number");
            }
            points.put(s.frequencyHz(), value);
        }
        Map<Standard, Table> copy = new EnumMap<>(tables);
        copy.put(standard, new Table(points));
        return new MeterCorrection(copy, loadReference);
    }

    /** This correction without {@code standard}'s readings. */
    public MeterCorrection without(Standard standard) {
        Map<Standard, Table> copy = new EnumMap<>(tables);
        copy.remove(standard);
        return new MeterCorrection(copy, loadReference);
    }

    /** This correction with the load standard's known (true) impedance, in ohms. */
    public MeterCorrection withLoadReference(Complex loadOhm) {
        if (loadOhm.isNaN() || loadOhm.isInfinite() || loadOhm.equals(Complex.ZERO)) {
            throw new IllegalArgumentException("the load reference must be a finite, non-zero"
                    + " impedance");
        }
        return new MeterCorrection(tables, loadOhm);
    }

    /** The load standard's known impedance in ohms. */
    public Complex loadReference() {
        return loadReference;
    }

    /** Whether readings of {@code standard} are held. */
    public boolean has(Standard standard) {
        return tables.containsKey(standard);
    }

    /** Whether {@link #apply} changes anything (an open or a short is held). */
    public boolean isActive() {
        return has(Standard.OPEN) || has(Standard.SHORT);
    }

    /**
     * Corrects one raw reading.
     *
     * @param frequencyHz the reading's frequency in Hz
     * @param measuredOhm the raw reading in ohms
     * @return the corrected impedance in ohms; the raw reading when no open or short is held
     */
    public Complex apply(double frequencyHz, Complex measuredOhm) {
        boolean open = has(Standard.OPEN);
        boolean shorted = has(Standard.SHORT);
        Table shortTable = tables.get(Standard.SHORT);
        Complex zs = shorted ? shortTable.at(frequencyHz, null) : Complex.ZERO;
        if (open && shorted && has(Standard.LOAD)) {
            Complex yo = tables.get(Standard.OPEN).at(frequencyHz, null);
            Complex zsm = tables.get(Standard.LOAD).at(frequencyHz, null);
            Complex numerator = Complex.ONE.subtract(zsm.multiply(yo))
                    .multiply(measuredOhm.subtract(zs));
            Complex denominator = zsm.subtract(zs)
                    .multiply(Complex.ONE.subtract(measuredOhm.multiply(yo)));
            return loadReference.multiply(numerator).divide(denominator);
        }
        if (!open && !shorted) {
            return measuredOhm;
        }
        // The stray admittance Yo = 1/(Zo − Zs) at each acquired open frequency (with the short
        // there), then interpolated: exact for a stray G + jωC.
        Complex strayY = open ? tables.get(Standard.OPEN).at(frequencyHz, (f, yom) -> {
            Complex zsAt = shorted ? shortTable.at(f, null) : Complex.ZERO;
            return yom.divide(Complex.ONE.subtract(zsAt.multiply(yom)));
        }) : Complex.ZERO;
        Complex d = measuredOhm.subtract(zs);
        return d.divide(Complex.ONE.subtract(d.multiply(strayY)));
    }

    private static String name(Standard s) {
        return s.name().toLowerCase(Locale.ROOT);
    }

    /** Values at ascending frequencies, linearly interpolated. */
    private static final class Table {
        private final double[] f;
        private final Complex[] v;

        Table(TreeMap<Double, Complex> points) {
            f = points.keySet().stream().sorted(Comparator.naturalOrder())
                    .mapToDouble(Double::doubleValue).toArray();
            v = points.values().toArray(new Complex[0]);
        }

        /**
         * The value at {@code frequencyHz}, linear between the two neighbouring samples, each
         * first mapped by {@code map} (frequency, stored value) when it is not null.
         */
        Complex at(double frequencyHz, BiFunction<Double, Complex, Complex> map) {
            BiFunction<Double, Complex, Complex> m = map == null ? (f0, x) -> x : map;
            int last = f.length - 1;
            if (frequencyHz <= f[0]) {
                return m.apply(f[0], v[0]);
            }
            if (frequencyHz >= f[last]) {
                return m.apply(f[last], v[last]);
            }
            int i = Arrays.binarySearch(f, frequencyHz);
            if (i >= 0) {
                return m.apply(f[i], v[i]);
            }
            int hi = -i - 1;
            int lo = hi - 1;
            double t = (frequencyHz - f[lo]) / (f[hi] - f[lo]);
            return m.apply(f[lo], v[lo]).multiply(1 - t).add(m.apply(f[hi], v[hi]).multiply(t));
        }
    }
}
