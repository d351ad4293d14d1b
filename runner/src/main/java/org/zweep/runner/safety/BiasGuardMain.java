package org.zweep.runner.safety;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Duration;
import java.time.Instant;
import java.util.Locale;
import java.util.concurrent.locks.LockSupport;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.Drive;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.SourceMode;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.results.RunManifest;

/**
 * The guard process of {@code zweep run} ({@link BiasGuard} starts it):
 * {@code BiasGuardMain ADDRESS RUN_FOLDER}, fed the run's DC bias changes on standard input.
 * When standard input ends (the run's process is gone) and the run did not write its final
 * manifest, or bias was last known on, it connects to the meter, ramps the bias down at the
 * step's rate from the last value the run sent, switches it off, and appends what it did to
 * {@code guard.log} in the run folder. Ignores Ctrl-C and SIGTERM: it ends by itself.
 */
public final class BiasGuardMain {
    /** The file in the run folder the guard appends its record to. */
    public static final String LOG = "guard.log";

    /** The last bias the run sent: {@code on} false when off. */
    record Last(boolean on, SourceMode mode, double value, double rampPerS, double frequencyHz, SourceMode drive,
            double level) {
        static final Last OFF = new Last(false, SourceMode.VOLTAGE, 0, Double.POSITIVE_INFINITY, 0,
                SourceMode.VOLTAGE, 0);

        /** Parses one feed line ({@code off}, or {@code on MODE VALUE RAMP FREQ DRIVE LEVEL}); null when not one. */
        static Last parse(String line) {
            String[] f = line.strip().split(" ");
            if (f.length == 1 && f[0].equals("off")) {
                return OFF;
            }
            if (f.length != 7 || !f[0].equals("on")) {
                return null;
            }
            try {
                return new Last(true, mode(f[1]), Double.parseDouble(f[2]), number(f[3]), Double.parseDouble(f[4]),
                        mode(f[5]), Double.parseDouble(f[6]));
            } catch (IllegalArgumentException e) {
                return null;
            }
        }

        private static double number(String s) {
            return s.equals("inf") ? Double.POSITIVE_INFINITY : Double.parseDouble(s);
        }

        private static SourceMode mode(String unit) {
            return switch (unit) {
                case "V" -> SourceMode.VOLTAGE;
                case "A" -> SourceMode.CURRENT;
                default -> throw new IllegalArgumentException(unit);
            };
        }

        MeasurementSetting setting(double biasValue) {
            Drive d = drive == SourceMode.VOLTAGE ? Drive.voltage(level) : Drive.current(level);
            return MeasurementSetting.at(frequencyHz).withDrive(d).withBias(new Bias(mode, biasValue, true));
        }
    }

    private BiasGuardMain() {
    }

    public static void main(String[] args) {
        if (args.length != 2) {
            System.err.println("usage: BiasGuardMain ADDRESS RUN_FOLDER");
            System.exit(2);
        }
        ignore("INT");
        ignore("TERM");
        ignore("HUP");
        String address = args[0];
        Path folder = Path.of(args[1]);
        // everything the ramp down needs is loaded now, while the run is alive: no class loading
        // (Jackson, the dialect, the transport) between the run's death and the first command
        String dialect = dialect(folder);
        warmUp(address, dialect);
        Last last = Last.OFF;
        boolean ended = false;
        try (BufferedReader in = new BufferedReader(new InputStreamReader(System.in, StandardCharsets.US_ASCII))) {
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                if (line.equals("end")) {
                    ended = true;
                } else {
                    Last l = Last.parse(line);
                    if (l != null) {
                        last = l;
                    }
                }
            }
        } catch (IOException e) {
            // the pipe broke: the run's process is gone all the same
        }
        Instant gone = Instant.now();
        String result = null;
        if (last.on()) {
            result = act(address, dialect, last); // first the bias, then the paperwork
        }
        String outcome = outcome(folder);
        boolean finalManifest = outcome != null && !outcome.equals("running");
        if (!last.on()) {
            if (ended || finalManifest) {
                return; // the run ended by itself with bias off
            }
            result = act(address, dialect, last);
        }
        String why = finalManifest ? "the run ended with DC bias last set on" : "the run's process ended without"
                + " its final manifest";
        String line = gone + " guard: " + why + " (run.json: " + (outcome == null ? "none" : outcome) + "); "
                + result;
        System.err.println("zweep guard: " + why + "; " + result);
        record(folder, line);
    }

    /** Ramps bias down from {@code last} and switches it off; says what happened. */
    static String act(String address, String dialect, Last last) {
        ScpiSettings settings = ScpiSettings.builder().readTimeout(Duration.ofSeconds(10)).build();
        RuntimeException failure = null;
        for (int attempt = 1; attempt <= 5; attempt++) {
            long t0 = System.nanoTime();
            try (org.zweep.driver.dialect.DialectMeter m = new org.zweep.driver.dialect.DialectMeter(
                    org.zweep.driver.scpi.ScpiClient.open(address, settings), org.zweep.driver.dialect.Dialect.load(dialect))) {
                String what;
                if (last.on()) {
                    m.apply(last.setting(last.value()));
                    // each value is sent no sooner than its step's wait after the one before it was sent,
                    // so the time the commands take counts into the wait (the ramp keeps its planned time)
                    // (the last value is held one step first: the run may have sent it just before it died)
                    long next = System.nanoTime() + (long) (BiasRamp.MAX_STEP_S * 1e9);
                    for (BiasRamp.Step s : BiasRamp.plan(last.value(), 0.0, last.rampPerS())) {
                        sleep((next - System.nanoTime()) / 1e9);
                        next = System.nanoTime() + (long) (s.waitS() * 1e9);
                        m.apply(last.setting(s.value()));
                    }
                    sleep((next - System.nanoTime()) / 1e9);
                    m.biasOff();
                    what = String.format(Locale.ROOT, "brought DC bias from %s %s down to 0 at %s %s/s and switched"
                            + " it off on %s in %.1f s (the meter confirmed)", last.value(), last.mode().unit(),
                            last.rampPerS(), last.mode().unit(), address, (System.nanoTime() - t0) / 1e9);
                } else {
                    m.biasOff();
                    what = "DC bias was last set off; switched it off again on " + address + " (the meter confirmed)";
                }
                return what;
            } catch (RuntimeException e) {
                failure = e;
                sleep(0.5);
            }
        }
        return "could NOT reach " + address + " to turn DC bias off (" + failure.getMessage() + "); last set: "
                + (last.on() ? last.value() + " " + last.mode().unit() : "off")
                + " - check the meter before touching the part";
    }

    /** Loads the classes the ramp down uses (nothing is sent to the meter). */
    private static void warmUp(String address, String dialect) {
        try {
            org.zweep.driver.address.Address.parse(address);
            org.zweep.driver.dialect.Dialect.load(dialect);
            BiasRamp.plan(1.0, 0.0, 1.0);
            Last.parse("on V 1.0 1.0 1000.0 V 0.5").setting(0.5);
            for (String c : new String[] {"org.zweep.driver.dialect.DialectMeter", "org.zweep.driver.scpi.ScpiClient"}) {
                Class.forName(c);
            }
        } catch (ReflectiveOperationException | RuntimeException | LinkageError e) {
            // loaded later, when needed
        }
    }

    private static String outcome(Path folder) {
        try {
            return RunManifest.read(folder.resolve("run.json")).outcome();
        } catch (RuntimeException e) {
            return null;
        }
    }

    private static String dialect(Path folder) {
        try {
            String d = RunManifest.read(folder.resolve("run.json")).meter().dialect();
            return d == null ? "standard" : d;
        } catch (RuntimeException e) {
            return "standard";
        }
    }

    private static void record(Path folder, String line) {
        if (!Files.isDirectory(folder)) {
            return;
        }
        try {
            Files.writeString(folder.resolve(LOG), line + System.lineSeparator(), StandardCharsets.UTF_8,
                    StandardOpenOption.CREATE, StandardOpenOption.APPEND, StandardOpenOption.SYNC);
        } catch (IOException e) {
            PrintStream err = System.err;
            err.println("zweep guard: cannot write " + folder.resolve(LOG) + ": " + e.getMessage());
        }
    }

    private static void sleep(double seconds) {
        long end = System.nanoTime() + (long) (seconds * 1e9);
        for (long left = end - System.nanoTime(); left > 0; left = end - System.nanoTime()) {
            LockSupport.parkNanos(left);
        }
    }

    /** Ignores signal {@code name} (through the JDK's {@code sun.misc.Signal}, when present). */
    private static void ignore(String name) {
        try {
            Class<?> signal = Class.forName("sun.misc.Signal");
            Class<?> handler = Class.forName("sun.misc.SignalHandler");
            Object ign = handler.getField("SIG_IGN").get(null);
            signal.getMethod("handle", signal, handler).invoke(null, signal.getConstructor(String.class)
                    .newInstance(name), ign);
        } catch (ReflectiveOperationException | RuntimeException | LinkageError e) {
            // without it, a Ctrl-C to the whole process group ends the guard with the run
        }
    }
}
