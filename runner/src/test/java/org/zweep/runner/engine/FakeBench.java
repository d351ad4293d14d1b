package org.zweep.runner.engine;

import org.zweep.runner.safety.Interruption;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import org.zweep.driver.MeterException;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.MeterIdentity;
import org.zweep.driver.meter.Interval;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;

/**
 * A small in-test bench: an instrument whose state (bias, correction) survives reconnects, a
 * device that is a 100 nF capacitor with 10 mOhm ESR, a virtual clock advanced by the waiter, a
 * trace of every command, and faults queued as values. Not thread-safe.
 */
final class FakeBench {
    static final class LinkDown extends MeterException {
        private static final long serialVersionUID = 1L;

        LinkDown(String m) {
            super(m);
        }
    }

    static final class MeterError extends MeterException {
        private static final long serialVersionUID = 1L;

        MeterError(String m) {
            super(m);
        }
    }

    /** A bias change seen by the instrument: when and to what. */
    record BiasEvent(double timeS, double value, boolean on) {
    }

    final List<String> trace = new ArrayList<>();
    final List<BiasEvent> biasHistory = new ArrayList<>();
    double nowS;
    Bias instrumentBias = Bias.OFF;
    int maxListPoints;
    int connections;
    /** Fail the n-th measure() (1-based, counted over the bench's life) with a lost link; 0 for none. */
    final List<Integer> dropAtMeasure = new ArrayList<>();
    int measures;
    /** How many reconnect attempts fail before one succeeds. */
    int failingReconnects;
    /** Fail the n-th measure() with a meter-reported error; 0 for none. */
    int meterErrorAtMeasure;
    /** The measure() calls (1-based) whose R arrives with its sign flipped (a reply corrupted on the way). */
    final List<Integer> negativeRAtMeasure = new ArrayList<>();
    /** What the meter's own fixture holds. */
    org.zweep.driver.meter.FixtureState slot = org.zweep.driver.meter.FixtureState.PART;
    /** How the meter's own correction applies what it acquired. */
    org.zweep.driver.meter.CorrectionStyle correctionStyle = org.zweep.driver.meter.CorrectionStyle.WHOLE_RANGE;
    /** Whether the meter has a fixture of its own (every state). */
    boolean simulator = true;
    /** Called as each trigger (a point or a list) is sent. */
    Runnable onTrigger = () -> { };
    /** Whether the meter can be asked what bias it holds (then a reconnect keeps the bias where it was). */
    boolean readsBias;

    final Waiter waiter = s -> {
        if (s > 0) {
            nowS += s;
        }
    };

    Waiter waiter(Interruption i) {
        return new Waiter() {
            @Override
            public void waitS(double s) {
                if (i.requested()) {
                    throw new RunInterruptedException(i.reason());
                }
                waiter.waitS(s);
            }

            @Override
            public void waitThroughStopS(double s) {
                waiter.waitS(s);
            }
        };
    }

    /** The DUT's impedance at {@code f}: 100 nF in series with 10 mOhm, plus a key-dependent tiny offset. */
    /** A setting as the trace shows it: frequency and bias. */
    static String label(MeasurementSetting s) {
        return s.frequencyHz() + " Hz" + (s.bias().on() ? " bias " + s.bias().value() : "");
    }

    /** The fake meter's own noise key: drawn from the setting alone, so that it is reproducible by itself. */
    static long key(MeasurementSetting s) {
        return Math.round(Math.log10(s.frequencyHz()) * 10) + (s.bias().on() ? 100 * Math.round(s.bias().value()) : 0);
    }

    static Impedance dut(double f, long key) {
        double x = -1.0 / (2 * Math.PI * f * 100e-9);
        return new Impedance(f, 0.010 + key * 1e-9, x);
    }

    final class FakeMeter implements Meter {
        private final int connection;
        private boolean broken;

        FakeMeter(int connection) {
            this.connection = connection;
        }

        private void live() {
            if (broken || connection != connections) {
                throw new LinkDown("connection " + connection + " is closed");
            }
        }

        @Override
        public MeterIdentity identify() {
            live();
            trace.add("identify");
            return new MeterIdentity("Fake", "BENCH", "0", "1");
        }

        @Override
        public void reset() {
            live();
            trace.add("reset");
            setBias(Bias.OFF);
        }

        @Override
        public MeterCapabilities capabilities() {
            return new MeterCapabilities(new Interval(20, 2e6), new Interval(0.005, 2), new Interval(1e-5, 0.02),
                    new Interval(-40, 40), new Interval(-1, 1), maxListPoints, Set.of(CorrectionStandard.values()), true,
                    correctionStyle);
        }

        @Override
        public void apply(MeasurementSetting s) {
            live();
            trace.add("apply " + s.frequencyHz() + " " + s.drive().levelRms() + " " + s.bias().appliedValue());
            if (!s.bias().equals(instrumentBias)) {
                setBias(s.bias());
            }
            current = s;
        }

        private MeasurementSetting current = MeasurementSetting.at(1000);

        @Override
        public Reading measure() {
            live();
            onTrigger.run();
            measures++;
            if (dropAtMeasure.contains(measures)) {
                broken = true;
                trace.add("measure (link dropped)");
                throw new LinkDown("connection reset while reading");
            }
            if (meterErrorAtMeasure == measures) {
                trace.add("measure (meter error)");
                throw new MeterError("meter reported -222,\"Data out of range\"");
            }
            trace.add("measure " + label(current));
            nowS += 0.01;
            Reading r = reading(current, key(current));
            if (negativeRAtMeasure.contains(measures)) {
                return new Reading(r.setting(), -r.real(), r.imaginary(), r.status(), r.timestamp());
            }
            return r;
        }

        @Override
        public List<Reading> measureList(List<MeasurementSetting> settings) {
            onTrigger.run();
            live();
            measures++;
            if (dropAtMeasure.contains(measures)) {
                broken = true;
                throw new LinkDown("connection reset while reading a list");
            }
            trace.add("list " + settings.size() + " from " + label(settings.get(0)));
            List<Reading> out = new ArrayList<>();
            for (int i = 0; i < settings.size(); i++) {
                out.add(reading(settings.get(i), key(settings.get(i))));
            }
            nowS += 0.01 * settings.size();
            return out;
        }

        private Reading reading(MeasurementSetting s, long key) {
            Impedance z = dut(s.frequencyHz(), key);
            return new Reading(s, z.resistanceOhm(), z.reactanceOhm(), ReadingStatus.OK,
                    Instant.ofEpochSecond(1_700_000_000L).plusNanos((long) (nowS * 1e9)));
        }

        @Override
        public void acquireCorrection(CorrectionStandard standard) {
            live();
            trace.add("acquire " + standard);
        }

        @Override
        public void setLoadStandard(Impedance known) {
            live();
            trace.add("load " + known.resistanceOhm());
        }

        @Override
        public void setCorrectionEnabled(boolean enabled) {
            live();
            trace.add("correction " + enabled);
        }

        @Override
        public java.util.Optional<Bias> readBias() {
            live();
            trace.add("read bias");
            return readsBias ? java.util.Optional.of(instrumentBias) : java.util.Optional.empty();
        }

        @Override
        public void biasOff() {
            live();
            trace.add("bias off");
            setBias(Bias.OFF);
        }

        @Override
        public boolean safeShutdown() {
            try {
                biasOff();
                return true;
            } catch (MeterException e) {
                return false;
            }
        }

        @Override
        public void close() {
            safeShutdown();
        }
    }

    private void setBias(Bias b) {
        Bias eff = b.on() ? b : Bias.OFF;
        if (!eff.equals(instrumentBias)) {
            instrumentBias = eff;
            biasHistory.add(new BiasEvent(nowS, eff.appliedValue(), eff.on()));
        }
    }

    final class Link implements MeterLink {
        FakeMeter meter = new FakeMeter(++connections);

        @Override
        public String address() {
            return "fake:bench";
        }

        @Override
        public Meter meter() {
            return meter;
        }

        @Override
        public Meter reconnect() {
            if (failingReconnects > 0) {
                failingReconnects--;
                trace.add("reconnect failed");
                throw new LinkDown("connection refused");
            }
            trace.add("reconnect");
            meter = new FakeMeter(++connections);
            return meter;
        }

        @Override
        public boolean isLinkFailure(MeterException e) {
            return e instanceof LinkDown;
        }

        @Override
        public Optional<org.zweep.driver.meter.FixtureControl> fixtureControl() {
            if (!simulator) {
                return Optional.empty();
            }
            return Optional.of(new org.zweep.driver.meter.FixtureControl() {
                @Override
                public java.util.Set<org.zweep.driver.meter.FixtureState> states() {
                    return java.util.EnumSet.allOf(org.zweep.driver.meter.FixtureState.class);
                }

                @Override
                public void hold(org.zweep.driver.meter.FixtureState s) {
                    meter.live();
                    trace.add("fixture " + s);
                    if (s == org.zweep.driver.meter.FixtureState.SECONDARY_OPEN
                            || s == org.zweep.driver.meter.FixtureState.SECONDARY_SHORTED) {
                        return;
                    }
                    slot = s;
                }
            });
        }

        @Override
        public void close() {
            trace.add("close");
        }
    }
}
