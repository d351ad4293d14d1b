package org.zweep.simulator.scpi;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.bench.FixtureSlot;
import org.zweep.simulator.bench.MeterLimits;
import org.zweep.simulator.bench.PointRequest;
import org.zweep.simulator.bench.PointResult;
import org.zweep.simulator.bench.Wiring;

/**
 * A small, noiseless test bench: a device R + jωL behind a fixture with a series residual Zs on
 * the meter side and a stray admittance Yo across the slot (the "ShortOpen" order of scikit-rf's skrf.calibration.deembedding).
 * Each point takes averages × aperture seconds; only a held range overloads. Records every request it sees.
 */
public final class TestBench implements Bench {
    /** 10 Hz to 10 MHz, 5 mV to 2 V, 50 µA to 20 mA, ±40 V / ±0.1 A bias, 201 list points, 1 Ω to 10 MΩ ranges. */
    public static final MeterLimits LIMITS = new MeterLimits(10, 10e6, 5e-3, 2, 50e-6, 20e-3, 40, 0.1, 201,
            new double[] {1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7}, 100);

    private final double resistanceOhm;
    private final double inductanceH;
    private final double residualOhm;
    private final double residualH;
    private final double strayF;
    private final List<PointRequest> requests = new ArrayList<>();
    private volatile FixtureSlot slot = FixtureSlot.DEVICE;
    private volatile Wiring wiring = Wiring.SECONDARY_OPEN;
    private volatile long seed;

    public TestBench(double resistanceOhm, double inductanceH, double residualOhm, double residualH, double strayF) {
        this.resistanceOhm = resistanceOhm;
        this.inductanceH = inductanceH;
        this.residualOhm = residualOhm;
        this.residualH = residualH;
        this.strayF = strayF;
    }

    /** An ideal 100 Ω resistor in an ideal fixture. */
    public static TestBench resistor() {
        return new TestBench(100, 0, 0, 0, 0);
    }

    /** The device's own impedance at {@code f}. */
    public Complex device(double f) {
        return new Complex(resistanceOhm, 2 * Math.PI * f * inductanceH);
    }

    @Override
    public MeterLimits limits() {
        return LIMITS;
    }

    @Override
    public synchronized PointResult measure(PointRequest r) {
        requests.add(r);
        double w = 2 * Math.PI * r.frequencyHz();
        double duration = r.averages() * r.apertureS();
        if (r.voltageRatio()) {
            return new PointResult(0.25, 0, false, duration, r.driveLevelRms(), Double.NaN);
        }
        Complex zs = new Complex(residualOhm, w * residualH);
        Complex yo = new Complex(0, w * strayF);
        Complex zm = switch (slot) {
            case OPEN -> strayF == 0 ? Complex.INF : zs.add(yo.reciprocal());
            case SHORT -> zs;
            case LOAD -> zs.add(yo.add(new Complex(100, 0).reciprocal()).reciprocal());
            case DEVICE -> zs.add(yo.add(device(r.frequencyHz()).reciprocal()).reciprocal());
        };
        double[] ranges = LIMITS.rangesOhm();
        double range = Double.isNaN(r.rangeUpperOhm()) ? ranges[ranges.length - 1] : r.rangeUpperOhm();
        // automatic ranging reads anything finite; a held range overloads above 1.5 times its limit
        boolean overload = zm.isInfinite() || (!Double.isNaN(r.rangeUpperOhm()) && zm.abs() > 1.5 * range);
        if (overload) {
            return new PointResult(Double.NaN, Double.NaN, true, duration, r.driveLevelRms(), range);
        }
        return new PointResult(zm.getReal(), zm.getImaginary(), false, duration, r.driveLevelRms(), range);
    }

    /** Every request so far, oldest first. */
    public synchronized List<PointRequest> requests() {
        return List.copyOf(requests);
    }

    @Override
    public FixtureSlot slot() {
        return slot;
    }

    @Override
    public void setSlot(FixtureSlot s) {
        slot = s;
    }

    @Override
    public Wiring wiring() {
        return wiring;
    }

    @Override
    public void setWiring(Wiring w) {
        wiring = w;
    }

    @Override
    public long seed() {
        return seed;
    }

    @Override
    public void setSeed(long s) {
        seed = s;
    }
}
