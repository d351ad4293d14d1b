package org.zweep.runner.safety;

import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.MeasurementSetting;

/**
 * The run's side of the guard process: starts {@link BiasGuardMain} in a small JVM of its own
 * with the meter's address and the run folder, and feeds it every DC bias change through a pipe
 * (one line each, before the command is sent). When the run's process disappears without its
 * final manifest (a crash, {@code kill -9}, the kernel's out-of-memory killer), the pipe closes
 * and the guard ramps the bias down and off itself. Thread-safe.
 */
public final class BiasGuard implements BiasWatcher, AutoCloseable {
    private final Process process;
    private final OutputStream feed;
    private volatile boolean broken;

    private BiasGuard(Process process) {
        this.process = process;
        this.feed = process.getOutputStream();
    }

    /**
     * Starts the guard for a run on the meter at {@code address} writing into {@code runFolder}.
     * Its messages go to this process's standard error (the same terminal).
     *
     * @throws UncheckedIOException when the guard process cannot be started
     */
    public static BiasGuard start(String address, Path runFolder) {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> cmd = new ArrayList<>(List.of(java, "-Xmx48m", "-XX:+UseSerialGC", "-XX:TieredStopAtLevel=1",
                "-cp", System.getProperty("java.class.path"), BiasGuardMain.class.getName(), address,
                runFolder.toAbsolutePath().toString()));
        ProcessBuilder pb = new ProcessBuilder(cmd);
        pb.redirectOutput(ProcessBuilder.Redirect.DISCARD);
        pb.redirectError(ProcessBuilder.Redirect.INHERIT);
        try {
            return new BiasGuard(pb.start());
        } catch (IOException e) {
            throw new UncheckedIOException("cannot start the bias guard process: " + e.getMessage(), e);
        }
    }

    /** The guard's process (for tests). */
    public ProcessHandle process() {
        return process.toHandle();
    }

    @Override
    public void applying(MeasurementSetting s, double rampPerS) {
        send(line(s, rampPerS));
    }

    /** The feed line for {@code s} about to be applied: {@code off}, or {@code on MODE VALUE RAMP FREQ DRIVE LEVEL}. */
    static String line(MeasurementSetting s, double rampPerS) {
        Bias b = s.bias();
        if (!b.on()) {
            return "off";
        }
        return String.format(Locale.ROOT, "on %s %s %s %s %s %s", b.mode().unit(), num(b.value()), num(rampPerS),
                num(s.frequencyHz()), s.drive().mode().unit(), num(s.drive().levelRms()));
    }

    @Override
    public void off() {
        send("off");
    }

    /** Tells the guard the run ended by itself (its final manifest is written) and lets it go. */
    @Override
    public void close() {
        send("end");
        synchronized (this) {
            try {
                feed.close();
            } catch (IOException e) {
                // the guard is gone already
            }
        }
    }

    private synchronized void send(String line) {
        if (broken) {
            return;
        }
        try {
            feed.write((line + "\n").getBytes(StandardCharsets.US_ASCII));
            feed.flush();
        } catch (IOException e) {
            broken = true; // the guard died: the run goes on, protected as before it existed
        }
    }

    private static String num(double v) {
        return Double.isInfinite(v) ? "inf" : Double.toString(v);
    }
}
