package org.zweep.simulator.bench;

import java.util.Objects;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicReference;
import org.apache.commons.math3.complex.Complex;

/**
 * The bench of a {@link BenchSpec}: an auto-balancing-bridge meter front end, the fixture and the
 * device.
 *
 * <p>Model of one point:
 * <ul>
 *   <li>The source is a voltage behind the source resistance. For a voltage drive its open-circuit
 *       level is the drive level; for a current drive it is set so that the drive current flows,
 *       but never above the highest voltage level. The level across the device follows from the
 *       divider (source resistance, fixture series residual, lead resistance in a 2-terminal
 *       connection, stray admittance across the slot); level-dependent parts are solved for it.</li>
 *   <li>DC bias: a bias voltage drives the DC path through the source resistance; a bias current
 *       is forced into it, up to the highest bias voltage (so a capacitor charges to that).</li>
 *   <li>Ranges: automatic ranging takes the lowest range whose upper limit is at least |Z|. Noise
 *       is complex Gaussian, 1σ = noise·(|Z|·(1 + |Z|/U) + U/1000), scaled by
 *       √(10 ms / (aperture·averages)) and by 1 V over the source level. A held range overloads
 *       above 1.5·U and below U/10⁴ (except the lowest range); the top range, in automatic
 *       ranging, up to 1000·U.</li>
 *   <li>A bench that states its accuracy ({@link StatedAccuracy}) replaces that noise, in every
 *       band it covers, by an error drawn from the statement: |Z|·(1 + e·d₁) and θ + e_θ·d₂ with
 *       d normal (σ = 1/2, limits stated at k = 2) or uniform on [−1, 1] (rectangular).</li>
 *   <li>Noise depends only on the seed, {@link PointRequest#noiseKey()} and the request, never on
 *       the order of calls or the thread.</li>
 *   <li>Timing (REAL): overhead + averages · max(aperture, 2/f), plus the bias settling time when
 *       the bias (on/off, kind or value) differs from the previous point measured on this bench
 *       (a new bench starts with the bias off). NONE: 0.</li>
 * </ul>
 *
 * <p>Thread-safe: the slot, wiring, seed and last bias are atomic; several connections may share
 * one bench.
 */
public final class SimulatedBench implements Bench {

    /** Overload above this multiple of a held range. */
    static final double OVERRANGE = 1.5;
    /** Overload below this fraction of a held range (except the lowest). */
    static final double UNDERRANGE = 1e-4;
    /** The top range in automatic ranging reads up to this multiple of its limit. */
    static final double TOP_OVERRANGE = 1000;
    /** Integration time the noise level refers to, in s. */
    static final double REFERENCE_INTEGRATION_S = 0.01;
    /** Minimum number of periods of the test frequency in one integration. */
    static final double MIN_PERIODS = 2;

    private record BiasState(boolean on, SourceKind kind, double value) {
    }

    private final BenchSpec spec;
    private volatile FixtureSlot slot = FixtureSlot.DEVICE;
    private volatile Wiring wiring = Wiring.SECONDARY_OPEN;
    private volatile long seed;
    private final AtomicReference<BiasState> lastBias =
            new AtomicReference<>(new BiasState(false, SourceKind.VOLTAGE, 0));

    /** A bench with the device in the slot, the second winding open and the spec's seed. */
    public SimulatedBench(BenchSpec spec) {
        this.spec = spec;
        this.seed = spec.seed();
    }

    /** The description this bench measures. */
    public BenchSpec spec() {
        return spec;
    }

    @Override
    public MeterLimits limits() {
        return spec.limits();
    }

    @Override
    public FixtureSlot slot() {
        return slot;
    }

    @Override
    public void setSlot(FixtureSlot newSlot) {
        slot = Objects.requireNonNull(newSlot);
    }

    @Override
    public Wiring wiring() {
        return wiring;
    }

    @Override
    public void setWiring(Wiring newWiring) {
        wiring = Objects.requireNonNull(newWiring);
    }

    @Override
    public long seed() {
        return seed;
    }

    @Override
    public void setSeed(long newSeed) {
        seed = newSeed;
    }

    /**
     * {@inheritDoc}
     *
     * <p>An overloaded point has NaN real and imaginary parts. A voltage ratio is measured with
     * the second winding open whatever {@link #wiring()} says, and reads zero (plus noise) for a
     * device without a second winding or an empty slot.
     *
     * @throws IllegalArgumentException if the request is outside {@link #limits()} (the server
     *     checks settings before it asks)
     */
    @Override
    public PointResult measure(PointRequest request) {
        check(request);
        FixtureSlot s = slot;
        Wiring w = wiring;
        // Off is off, whatever kind and value are set.
        BiasState bias = request.biasOn()
                ? new BiasState(true, request.bias(), request.biasValue())
                : new BiasState(false, SourceKind.VOLTAGE, 0);
        boolean biasChanged = !bias.equals(lastBias.getAndSet(bias));
        double duration = duration(request, biasChanged);

        Front front = solve(request, s, w);
        double range = chooseRange(front.measured.abs(), request.rangeUpperOhm());
        SplittableRandom random = new SplittableRandom(mix(seed, request.noiseKey()));
        double scale = spec.meter().noiseRel() * noiseScale(request, front);
        if (request.voltageRatio()) {
            Complex ratio = s == FixtureSlot.DEVICE
                    ? spec.device().voltageRatio(request.frequencyHz(), front.op) : Complex.ZERO;
            double sigma = scale * (ratio.abs() + 1e-3);
            return new PointResult(ratio.getReal() + sigma * random.nextGaussian(),
                    ratio.getImaginary() + sigma * random.nextGaussian(), false, duration,
                    front.op.acVoltageRms(), range);
        }
        double magnitude = front.measured.abs();
        if (overloaded(magnitude, range, Double.isNaN(request.rangeUpperOhm()))) {
            return new PointResult(Double.NaN, Double.NaN, true, duration,
                    front.op.acVoltageRms(), range);
        }
        StatedAccuracy stated = spec.meter().accuracy();
        StatedAccuracy.Band band = stated == null ? null
                : stated.band(request.frequencyHz(), request.drive(), request.driveLevelRms(), request.apertureS());
        if (band != null) {
            // The reading's whole error is drawn from the stated accuracy, magnitude and phase apart.
            double em = band.magnitudeLimit(magnitude) * draw(random, stated.normal());
            double et = band.phaseLimitRad(magnitude) * draw(random, stated.normal());
            double theta = front.measured.getArgument() + et;
            double m = magnitude * (1 + em);
            return new PointResult(m * Math.cos(theta), m * Math.sin(theta), false, duration,
                    front.op.acVoltageRms(), range);
        }
        double sigma = scale * (magnitude * (1 + magnitude / range) + range * 1e-3);
        return new PointResult(front.measured.getReal() + sigma * random.nextGaussian(),
                front.measured.getImaginary() + sigma * random.nextGaussian(), false, duration,
                front.op.acVoltageRms(), range);
    }

    /** A unit error: normal with σ = 1/2 (a limit stated at k = 2), or uniform on [−1, 1]. */
    private static double draw(SplittableRandom random, boolean normal) {
        return normal ? random.nextGaussian() / 2 : 2 * random.nextDouble() - 1;
    }

    private void check(PointRequest r) {
        MeterLimits l = spec.limits();
        require(r.frequencyHz() >= l.minFrequencyHz() && r.frequencyHz() <= l.maxFrequencyHz(),
                "frequency " + r.frequencyHz() + " Hz outside the meter's limits");
        if (r.drive() == SourceKind.VOLTAGE) {
            require(r.driveLevelRms() >= l.minVoltageVrms()
                    && r.driveLevelRms() <= l.maxVoltageVrms(),
                    "voltage level " + r.driveLevelRms() + " V outside the meter's limits");
        } else {
            require(r.driveLevelRms() >= l.minCurrentArms()
                    && r.driveLevelRms() <= l.maxCurrentArms(),
                    "current level " + r.driveLevelRms() + " A outside the meter's limits");
        }
        double maxBias = r.bias() == SourceKind.VOLTAGE ? l.maxBiasVoltageV() : l.maxBiasCurrentA();
        require(!r.biasOn() || Math.abs(r.biasValue()) <= maxBias,
                "bias " + r.biasValue() + " outside the meter's limits");
        require(r.averages() >= 1, "averages must be at least 1");
        require(r.apertureS() > 0 && Double.isFinite(r.apertureS()),
                "aperture must be positive");
        require(Double.isNaN(r.rangeUpperOhm()) || r.rangeUpperOhm() > 0,
                "range must be positive or NaN (automatic)");
    }

    private static void require(boolean ok, String what) {
        if (!ok) {
            throw new IllegalArgumentException(what);
        }
    }

    private double duration(PointRequest r, boolean biasChanged) {
        MeterSpec m = spec.meter();
        if (m.timing() == Timing.NONE) {
            return 0;
        }
        double integration = Math.max(r.apertureS(), MIN_PERIODS / r.frequencyHz());
        return m.pointOverheadS() + r.averages() * integration
                + (biasChanged ? m.biasSettlingS() : 0);
    }

    /** The source level the noise refers to: 1 V (or 10 mA into 100 Ω) gives a factor of 1. */
    private double noiseScale(PointRequest r, Front front) {
        double integration = Math.sqrt(REFERENCE_INTEGRATION_S / (r.apertureS() * r.averages()));
        return integration / front.sourceVrms;
    }

    private double chooseRange(double magnitude, double held) {
        if (!Double.isNaN(held)) {
            return held;
        }
        double[] ranges = spec.limits().rangesOhm();
        for (double u : ranges) {
            if (magnitude <= u) {
                return u;
            }
        }
        return ranges[ranges.length - 1];
    }

    private boolean overloaded(double magnitude, double range, boolean auto) {
        if (!Double.isFinite(magnitude)) {
            return true;
        }
        double[] ranges = spec.limits().rangesOhm();
        boolean top = range >= ranges[ranges.length - 1];
        double over = auto && top ? TOP_OVERRANGE : OVERRANGE;
        boolean lowest = range <= ranges[0];
        return magnitude > over * range || (!auto && !lowest && magnitude < UNDERRANGE * range);
    }

    /** The solved front end for one point. */
    private record Front(Complex measured, OperatingPoint op, double sourceVrms) {
    }

    /** Solves the divider (and the level-dependent device in it) for one point. */
    Front solve(PointRequest r, FixtureSlot s, Wiring w) {
        double f = r.frequencyHz();
        FixtureSpec fx = spec.fixture();
        Device device = spec.device();
        double rs = spec.limits().sourceResistanceOhm();
        Complex series = fx.seriesImpedance(f);
        Complex stray = fx.strayAdmittance(f);
        OperatingPoint op = s == FixtureSlot.DEVICE ? dcPoint(r, device, fx) : OperatingPoint.NONE;
        int iterations = s == FixtureSlot.DEVICE && device.levelDependent() ? 50 : 1;
        Front front = null;
        Complex previous = null;
        for (int i = 0; i < iterations; i++) {
            Complex slotZ = switch (s) {
                case OPEN -> null;
                case SHORT -> Complex.ZERO;
                case LOAD -> fx.loadImpedance(f);
                case DEVICE -> device.impedance(f, op, w);
            };
            front = divider(r, rs, series, stray, slotZ, op);
            op = front.op;
            if (slotZ == null || (previous != null
                    && slotZ.subtract(previous).abs() <= 1e-13 * slotZ.abs())) {
                break;
            }
            previous = slotZ;
        }
        return front;
    }

    private Front divider(PointRequest r, double rs, Complex series, Complex stray, Complex slotZ,
            OperatingPoint op) {
        // The impedance across the slot terminals: the slot in parallel with the stray admittance.
        Complex across;
        if (slotZ == null) {
            across = stray.equals(Complex.ZERO) ? Complex.INF : stray.reciprocal();
        } else if (slotZ.equals(Complex.ZERO)) {
            across = Complex.ZERO;
        } else {
            across = slotZ.reciprocal().add(stray).reciprocal();
        }
        double maxV = spec.limits().maxVoltageVrms();
        if (across.isInfinite()) {
            double v = r.drive() == SourceKind.VOLTAGE ? r.driveLevelRms() : maxV;
            return new Front(Complex.INF, op.withAc(v, 0), v);
        }
        Complex measured = series.add(across);
        double loop = measured.add(rs).abs();
        double sourceV = r.drive() == SourceKind.VOLTAGE ? r.driveLevelRms()
                : Math.min(maxV, r.driveLevelRms() * loop);
        double current = sourceV / loop;
        double vAcross = current * across.abs();
        double iSlot = slotZ == null || slotZ.equals(Complex.ZERO) ? current
                : vAcross / slotZ.abs();
        return new Front(measured, op.withAc(vAcross, iSlot), sourceV);
    }

    private OperatingPoint dcPoint(PointRequest r, Device device, FixtureSpec fx) {
        if (!r.biasOn() || r.biasValue() == 0) {
            return OperatingPoint.NONE;
        }
        double rd = device.dcResistanceOhm();
        double maxV = spec.limits().maxBiasVoltageV();
        if (r.bias() == SourceKind.VOLTAGE) {
            if (Double.isInfinite(rd)) {
                return new OperatingPoint(0, 0, r.biasValue(), 0);
            }
            double i = r.biasValue() / (spec.limits().sourceResistanceOhm()
                    + fx.seriesResistanceOhm() + rd);
            return new OperatingPoint(0, 0, i * rd, i);
        }
        double v = Double.isInfinite(rd) ? Math.signum(r.biasValue()) * maxV : r.biasValue() * rd;
        if (Math.abs(v) > maxV) {
            v = Math.signum(v) * maxV;
            return new OperatingPoint(0, 0, v, Double.isInfinite(rd) ? 0 : v / rd);
        }
        return new OperatingPoint(0, 0, v, r.biasValue());
    }

    /** A 64-bit mix of seed and key (the SplitMix64 finaliser applied twice). */
    static long mix(long seed, long key) {
        return finalise(finalise(seed) ^ (key + 0x9E3779B97F4A7C15L));
    }

    private static long finalise(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }
}
