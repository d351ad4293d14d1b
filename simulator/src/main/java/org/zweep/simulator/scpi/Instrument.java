package org.zweep.simulator.scpi;

import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.locks.Condition;
import java.util.concurrent.locks.ReentrantLock;
import java.util.function.Consumer;
import java.util.function.Function;
import org.apache.commons.math3.complex.Complex;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.bench.MeterCorrection;
import org.zweep.simulator.bench.MeterLimits;
import org.zweep.simulator.bench.PointRequest;
import org.zweep.simulator.bench.PointResult;
import org.zweep.simulator.bench.SourceKind;

/**
 * The simulated impedance meter: one set of settings, one status structure and error queue, one
 * measurement engine, in front of a {@link Bench}. Every connection shares it; each connection
 * talks to it through its own {@link Session} (its own parser, header path and output queue).
 *
 * <p>{@code INITiate}, list sweeps and {@code CORRection:COLLect} are overlapped operations run on
 * one worker thread, so {@code *OPC}, {@code *OPC?}, {@code *WAI}, the OPERation MEASuring bit and
 * {@code -213 Init ignored} behave as IEEE 488.2 §12.5 describes. Thread-safe.
 */
public final class Instrument implements AutoCloseable {
    /** The manufacturer field of {@code *IDN?}: a made-up maker; the runner recognises the simulator by it. */
    public static final String MANUFACTURER = "Korvane Bench Instruments";
    /** The model field of {@code *IDN?}. */
    public static final String MODEL = "ZS-1 Impedance Simulator";
    /** The firmware field of {@code *IDN?}: the version of this command set. */
    public static final String FIRMWARE = "1.0";
    /** The whole {@code *IDN?} reply (IEEE 488.2 §10.14: maker, model, serial 0, firmware). */
    public static final String IDENTIFICATION = MANUFACTURER + "," + MODEL + ",0," + FIRMWARE;

    enum State { IDLE, WAITING_FOR_TRIGGER, MEASURING }

    /** One overlapped operation, prepared under the lock. */
    private record Job(long generation, List<PointRequest> points, MeterCorrection.Standard collect,
            double[] grid, MeterCorrection correction) {
    }

    /** Points per decade of the log grid the correction standards are acquired on. */
    static final int CORRECTION_POINTS_PER_DECADE = 10;

    /** The noise keys of the triggers, over all connections. */
    private final NoiseKeys noiseKeys = new NoiseKeys();
    private final ReentrantLock lock = new ReentrantLock();
    private final Condition idle = lock.newCondition();
    private final InstrumentOptions options;
    private final Sleeper sleeper;
    private final StatusModel status;
    private final CommandTree tree;
    private final ExecutorService worker;

    private volatile Bench bench;
    private volatile TimingModel timing;
    private Settings settings;
    private State state = State.IDLE;
    private Job pending;
    private Future<?> running;
    private long generation;
    private double[] data;
    private double lastRangeOhm = Double.NaN;
    private boolean opcArmed;
    private MeterCorrection correction = MeterCorrection.none();
    private final BiasHistory biasHistory = new BiasHistory(java.time.Instant::now);

    /** A meter in front of {@code bench} with the SCPI command set and the SIMulate subsystem. */
    public Instrument(Bench bench, InstrumentOptions options) {
        this(bench, options, b -> { }, Sleeper.THREAD);
    }

    /**
     * As {@link #Instrument(Bench, InstrumentOptions)}, with {@code extraCommands} added to the
     * command tree (the server adds its fault-injection commands this way).
     */
    public Instrument(Bench bench, InstrumentOptions options, Consumer<CommandTree.Builder> extraCommands) {
        this(bench, options, extraCommands, Sleeper.THREAD);
    }

    Instrument(Bench bench, InstrumentOptions options, Consumer<CommandTree.Builder> extraCommands, Sleeper sleeper) {
        this.bench = bench;
        this.options = options;
        this.timing = options.timing();
        this.sleeper = sleeper;
        this.status = new StatusModel(options.errorQueueDepth());
        this.settings = Settings.defaults(bench.limits());
        CommandTree.Builder b = CommandTree.builder();
        MeterCommands.register(b, this);
        SimulateCommands.register(b, this);
        extraCommands.accept(b);
        this.tree = b.build();
        this.worker = Executors.newSingleThreadExecutor(r -> {
            Thread t = new Thread(r, "zweep-sim-measure");
            t.setDaemon(true);
            return t;
        });
    }

    /** Opens a session for one connection; {@code hooks} lets it see the connection's output queue. */
    public Session openSession(Session.Hooks hooks) {
        return new Session(this, tree, hooks, options.strict());
    }

    /** The bench in front of which the meter sits now. */
    public Bench bench() {
        return bench;
    }

    /** Replaces the bench (aborts any running operation; settings are kept). */
    public void setBench(Bench newBench) {
        abort();
        this.bench = newBench;
    }

    /**
     * Forgets which triggers were measured before: from now on the noise is drawn as by a meter
     * just started ({@code SIMulate:SEED} does this, so that a seed set again repeats its readings).
     */
    void restartNoise() {
        noiseKeys.restart();
    }

    /** The timing model in use. */
    public TimingModel timing() {
        return timing;
    }

    /** Switches the timing model. */
    public void setTiming(TimingModel t) {
        this.timing = t;
    }

    /** The DC bias applied over time ({@code SIMulate:BIAS:HISTory?}). */
    BiasHistory biasHistory() {
        return biasHistory;
    }

    InstrumentOptions options() {
        return options;
    }

    StatusModel status() {
        return status;
    }

    MeterLimits limits() {
        return bench.limits();
    }

    <T> T read(Function<Settings, T> f) {
        lock.lock();
        try {
            return f.apply(settings);
        } finally {
            lock.unlock();
        }
    }

    void update(Consumer<Settings> f) {
        lock.lock();
        try {
            f.accept(settings);
            biasHistory.record(settings);
        } finally {
            lock.unlock();
        }
    }

    // ---- IEEE 488.2 common-command behaviour

    /** {@code *RST} (IEEE 488.2 §10.32): settings to defaults, operations aborted, OCIS/OQIS. */
    void reset() {
        lock.lock();
        try {
            opcArmed = false;
            abortLocked();
            settings = Settings.defaults(bench.limits());
            biasHistory.record(settings);
            data = null;
            opcArmed = false;
            status.setQuestionable(StatusModel.QUES_OVERLOAD, false);
        } finally {
            lock.unlock();
        }
    }

    /** {@code *CLS} (IEEE 488.2 §10.3): event registers, error queue, OPC machine to idle. */
    void clearStatus() {
        lock.lock();
        try {
            status.clear();
            opcArmed = false;
        } finally {
            lock.unlock();
        }
    }

    /** {@code *OPC} (IEEE 488.2 §12.5.2): ESR bit 0 once no operation is pending. */
    void armOpc() {
        lock.lock();
        try {
            if (state == State.IDLE) {
                status.setEsrBits(StatusModel.ESR_OPC);
            } else {
                opcArmed = true;
            }
        } finally {
            lock.unlock();
        }
    }

    /**
     * Blocks until no operation is pending (the no-operation-pending flag of IEEE 488.2 §12.5.1).
     *
     * @return {@code false} if the calling thread was interrupted (its connection closed)
     */
    boolean awaitIdle() {
        lock.lock();
        try {
            while (state != State.IDLE) {
                idle.await();
            }
            return true;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        } finally {
            lock.unlock();
        }
    }

    // ---- trigger model (SCPI-1999 Vol 2, TRIGger subsystem)

    /** {@code INITiate}: -213 if an operation is already pending. */
    void initiate(Session session) {
        lock.lock();
        try {
            if (state != State.IDLE) {
                throw new ScpiException(StandardError.INIT_IGNORED, "a measurement is in progress");
            }
            Job job = prepareMeasurement(session);
            if (settings.triggerBus) {
                pending = job;
                state = State.WAITING_FOR_TRIGGER;
                status.setOperation(StatusModel.OPER_WAITING_FOR_TRIGGER, true);
            } else {
                start(job);
            }
        } finally {
            lock.unlock();
        }
    }

    /** {@code *TRG}: starts an initiated measurement waiting for a bus trigger, else -211. */
    void trigger() {
        lock.lock();
        try {
            if (state != State.WAITING_FOR_TRIGGER) {
                throw new ScpiException(StandardError.TRIGGER_IGNORED, "not waiting for a trigger");
            }
            status.setOperation(StatusModel.OPER_WAITING_FOR_TRIGGER, false);
            Job job = pending;
            pending = null;
            start(job);
        } finally {
            lock.unlock();
        }
    }

    /** {@code ABORt}: back to idle; the last completed data stay. */
    void abort() {
        lock.lock();
        try {
            abortLocked();
        } finally {
            lock.unlock();
        }
    }

    private void abortLocked() {
        generation++;
        if (running != null) {
            running.cancel(true);
            running = null;
        }
        pending = null;
        toIdleLocked();
    }

    /** {@code CORRection:COLLect}: acquires {@code standard} (whatever is in the slot now) over the grid. */
    void collect(Session session, MeterCorrection.Standard standard) {
        lock.lock();
        try {
            if (state != State.IDLE) {
                throw new ScpiException(StandardError.SETTINGS_CONFLICT, "a measurement is in progress");
            }
            double[] grid = MeterCorrection.frequencies(bench.limits(), CORRECTION_POINTS_PER_DECADE);
            PointRequest template = request(settings, false, grid[0], levelOf(settings), settings.biasVoltageV,
                    Double.NaN, 0);
            template = template.withNoiseKey(noiseKeys.draw(List.of(template), bench.slot(), bench.wiring(),
                    standard.ordinal()));
            status.setOperation(StatusModel.OPER_CALIBRATING, true);
            start(new Job(++generation, List.of(template), standard, grid, null));
        } finally {
            lock.unlock();
        }
    }

    /** {@code FETCh?}: the last completed data, waiting for a running measurement. */
    Response fetch() {
        lock.lock();
        try {
            while (state == State.MEASURING) {
                try {
                    idle.await();
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                    return null;
                }
            }
            if (state == State.WAITING_FOR_TRIGGER) {
                throw new ScpiException(StandardError.TRIGGER_DEADLOCK, "waiting for a bus trigger");
            }
            if (data == null) {
                throw new ScpiException(StandardError.DATA_CORRUPT_OR_STALE, "no completed measurement");
            }
            return format(data, settings.real64, settings.swapped);
        } finally {
            lock.unlock();
        }
    }

    /** {@code READ?} = {@code ABORt;INITiate;FETCh?}; -214 with a bus trigger. */
    Response readNew(Session session) {
        lock.lock();
        try {
            if (settings.triggerBus) {
                throw new ScpiException(StandardError.TRIGGER_DEADLOCK, "READ? with TRIGger:SOURce BUS");
            }
            abortLocked();
            data = null;
            start(prepareMeasurement(session));
            return fetch();
        } finally {
            lock.unlock();
        }
    }

    State state() {
        lock.lock();
        try {
            return state;
        } finally {
            lock.unlock();
        }
    }

    boolean correctionAvailable() {
        lock.lock();
        try {
            return correction.isActive();
        } finally {
            lock.unlock();
        }
    }

    /** The range the last point was measured in, or {@code NaN}. */
    double lastRangeOhm() {
        lock.lock();
        try {
            return lastRangeOhm;
        } finally {
            lock.unlock();
        }
    }

    static Response format(double[] values, boolean real64, boolean swapped) {
        if (real64) {
            ByteBuffer buf = ByteBuffer.allocate(values.length * Double.BYTES)
                    .order(swapped ? ByteOrder.LITTLE_ENDIAN : ByteOrder.BIG_ENDIAN);
            for (double v : values) {
                buf.putDouble(Numbers.wire(v));
            }
            return Response.block(buf.array());
        }
        StringBuilder b = new StringBuilder(values.length * 24);
        for (int i = 0; i < values.length; i++) {
            if (i > 0) {
                b.append(',');
            }
            b.append(Numbers.nr3(values[i]));
        }
        return Response.text(b.toString());
    }

    private Job prepareMeasurement(Session session) {
        Settings s = settings;
        List<PointRequest> points = new ArrayList<>();
        if (s.listMode) {
            int n = s.listFrequencyHz.length;
            if (n == 0) {
                throw new ScpiException(StandardError.SETTINGS_CONFLICT, "FREQuency:MODE LIST with an empty LIST:FREQuency");
            }
            // only the lists that take part in this sweep must match it: the level list with a
            // voltage drive, the bias list with the voltage bias on
            boolean levelListed = s.drive == SourceKind.VOLTAGE && s.listVoltageVrms.length > 0;
            boolean biasListed = s.voltageBiasOn && s.listBiasVoltageV.length > 0;
            if ((levelListed && !lengthFits(s.listVoltageVrms.length, n))
                    || (biasListed && !lengthFits(s.listBiasVoltageV.length, n))) {
                throw new ScpiException(StandardError.LISTS_NOT_SAME_LENGTH, "LIST:FREQuency has " + n + " points");
            }
            for (int i = 0; i < n; i++) {
                double level = levelListed ? pick(s.listVoltageVrms, i) : levelOf(s);
                double bias = biasListed ? pick(s.listBiasVoltageV, i) : s.biasVoltageV;
                points.add(request(s, s.voltageRatio, s.listFrequencyHz[i], level, bias, heldRange(s), 0));
            }
        } else {
            points.add(request(s, s.voltageRatio, s.frequencyHz, levelOf(s), s.biasVoltageV, heldRange(s), 0));
        }
        long key = noiseKeys.draw(points, bench.slot(), bench.wiring(), -1);
        for (int i = 0; i < points.size(); i++) {
            points.set(i, points.get(i).withNoiseKey(key + i));
        }
        MeterCorrection corr = null;
        if (s.correctionOn && !s.voltageRatio) {
            if (!correction.isActive()) {
                throw new ScpiException(StandardError.SETTINGS_CONFLICT, "CORRection:STATe ON with no open or short collected");
            }
            try {
                corr = correction.withLoadReference(new Complex(s.loadResistanceOhm, s.loadReactanceOhm));
            } catch (IllegalArgumentException e) {
                throw new ScpiException(StandardError.SETTINGS_CONFLICT, e.getMessage());
            }
        }
        return new Job(++generation, points, null, null, corr);
    }

    private static boolean lengthFits(int len, int n) {
        return len == 0 || len == 1 || len == n;
    }

    private static double pick(double[] list, int i) {
        return list.length == 1 ? list[0] : list[i];
    }

    private static double levelOf(Settings s) {
        return s.drive == SourceKind.VOLTAGE ? s.voltageVrms : s.currentArms;
    }

    private static double heldRange(Settings s) {
        return s.rangeAuto ? Double.NaN : s.rangeOhm;
    }

    private static PointRequest request(Settings s, boolean ratio, double f, double level, double biasVoltageV,
            double range, long key) {
        boolean currentBias = s.currentBiasOn;
        return PointRequest.at(f).voltageRatio(ratio).drive(s.drive, level)
                .bias(currentBias ? SourceKind.CURRENT : SourceKind.VOLTAGE, currentBias ? s.biasCurrentA : biasVoltageV,
                        s.voltageBiasOn || s.currentBiasOn)
                .averages(s.averages).apertureS(s.apertureS).rangeUpperOhm(range).noiseKey(key).build();
    }

    /**
     * Starts {@code job} on the worker. Its points are timed from now, the instant of the trigger,
     * not from when the worker gets to them: the hand-off to the worker thread is part of the
     * modelled duration rather than added to it.
     */
    private void start(Job job) {
        state = State.MEASURING;
        status.setOperation(StatusModel.OPER_MEASURING, true);
        long triggeredNanos = sleeper.nanoTime();
        running = worker.submit(() -> run(job, triggeredNanos));
    }

    /**
     * Point {@code i} of a sweep ends at the trigger instant plus the modelled durations of points
     * 0..i, so neither the physics' compute time nor a late wake-up of one point delays the next:
     * the sweep as a whole takes what the timing model says, to within one wake-up.
     */
    private void run(Job job, long triggeredNanos) {
        if (job.collect() != null) {
            collectRun(job, triggeredNanos);
            return;
        }
        List<PointRequest> points = job.points();
        double[] values = new double[points.size() * 2];
        boolean overload = false;
        double range = Double.NaN;
        double elapsedS = 0.0;
        try {
            Bench b = bench;
            for (int i = 0; i < points.size(); i++) {
                if (Thread.currentThread().isInterrupted()) {
                    return;
                }
                PointRequest req = points.get(i);
                PointResult r = b.measure(req);
                if (timing == TimingModel.REAL) {
                    elapsedS += r.durationS();
                    sleeper.sleepUntil(triggeredNanos + (long) (elapsedS * 1e9));
                }
                range = r.rangeUsedOhm();
                if (r.overload()) {
                    overload = true;
                    values[2 * i] = Double.NaN;
                    values[2 * i + 1] = Double.NaN;
                } else if (job.correction() != null) {
                    Complex z = job.correction().apply(req.frequencyHz(), new Complex(r.real(), r.imaginary()));
                    values[2 * i] = z.getReal();
                    values[2 * i + 1] = z.getImaginary();
                } else {
                    values[2 * i] = r.real();
                    values[2 * i + 1] = r.imaginary();
                }
            }
        } catch (InterruptedException e) {
            return;
        } catch (RuntimeException e) {
            finish(job, null, null, false, range, e);
            return;
        }
        finish(job, values, null, overload, range, null);
    }

    private void collectRun(Job job, long triggeredNanos) {
        MeterCorrection.Acquisition acq;
        try {
            acq = MeterCorrection.acquire(bench, job.grid(), job.points().get(0));
            if (timing == TimingModel.REAL) {
                sleeper.sleepUntil(triggeredNanos + (long) (acq.durationS() * 1e9));
            }
        } catch (InterruptedException e) {
            return;
        } catch (RuntimeException e) {
            finish(job, null, null, false, Double.NaN, e);
            return;
        }
        finish(job, null, acq, false, Double.NaN, null);
    }

    private void finish(Job job, double[] values, MeterCorrection.Acquisition acq, boolean overload, double range,
            RuntimeException failure) {
        lock.lock();
        try {
            if (job.generation() != generation) {
                return;
            }
            running = null;
            if (failure != null) {
                status.report(StandardError.EXECUTION_ERROR.code(),
                        StandardError.EXECUTION_ERROR.text() + ";" + failure.getMessage());
            } else if (acq != null) {
                try {
                    correction = correction.with(job.collect(), acq.samples());
                } catch (IllegalArgumentException e) {
                    status.report(StandardError.EXECUTION_ERROR.code(),
                            StandardError.EXECUTION_ERROR.text() + ";" + e.getMessage());
                }
            } else {
                data = values;
                status.setQuestionable(StatusModel.QUES_OVERLOAD, overload);
            }
            if (!Double.isNaN(range)) {
                lastRangeOhm = range;
            }
            toIdleLocked();
        } finally {
            lock.unlock();
        }
    }

    private void toIdleLocked() {
        state = State.IDLE;
        status.setOperation(StatusModel.OPER_MEASURING | StatusModel.OPER_CALIBRATING
                | StatusModel.OPER_WAITING_FOR_TRIGGER, false);
        if (opcArmed) {
            opcArmed = false;
            status.setEsrBits(StatusModel.ESR_OPC);
        }
        idle.signalAll();
    }

    /** Stops the measurement worker. */
    @Override
    public void close() {
        abort();
        worker.shutdownNow();
    }
}
