package org.zweep.runner.engine;

import java.io.PrintWriter;
import java.time.Duration;
import java.util.Locale;
import java.util.function.LongSupplier;
import org.zweep.runner.results.PointRow;

/**
 * Progress on a console: on a terminal, one line redrawn in place (points done and total, the
 * current setting, elapsed time and ETA); otherwise plain lines at most every
 * {@code plainIntervalS} seconds. Not thread-safe.
 */
public final class ConsoleProgress implements ProgressListener {
    private final PrintWriter out;
    private final boolean terminal;
    private final LongSupplier nanoClock;
    private final double plainIntervalS;
    private long startNs;
    private long lastPrintNs;
    private int startDone;
    private int lastLength;
    private String last = "";

    /**
     * @param out where to print
     * @param terminal whether {@code out} is a terminal (redraw one line) or not (plain lines)
     * @param nanoClock a monotonic clock in nanoseconds ({@code System::nanoTime})
     * @param plainIntervalS the least time between two plain lines, in seconds
     */
    public ConsoleProgress(PrintWriter out, boolean terminal, LongSupplier nanoClock, double plainIntervalS) {
        this.out = out;
        this.terminal = terminal;
        this.nanoClock = nanoClock;
        this.plainIntervalS = plainIntervalS;
    }

    @Override
    public void started(int total, int done) {
        startNs = nanoClock.getAsLong();
        lastPrintNs = startNs;
        startDone = done;
        String line = done == 0 ? "measuring " + total + " points" : "resuming: " + done + " of " + total
                + " points already measured";
        out.println(line);
        out.flush();
    }

    @Override
    public void measured(PointRow row, int done, int total) {
        long now = nanoClock.getAsLong();
        last = status(row, done, total, now);
        if (terminal) {
            redraw(last);
        } else if ((now - lastPrintNs) / 1e9 >= plainIntervalS || done == total) {
            out.println(last);
            out.flush();
            lastPrintNs = now;
        }
    }

    @Override
    public void note(String line) {
        if (terminal && lastLength > 0) {
            out.print("\r" + " ".repeat(lastLength) + "\r");
        }
        out.println(line);
        if (terminal && !last.isEmpty()) {
            redraw(last);
        }
        out.flush();
    }

    @Override
    public void finished() {
        if (terminal && lastLength > 0) {
            out.println();
            lastLength = 0;
        }
        out.flush();
    }

    private void redraw(String line) {
        String pad = line.length() < lastLength ? " ".repeat(lastLength - line.length()) : "";
        out.print("\r" + line + pad);
        out.flush();
        lastLength = line.length();
    }

    String status(PointRow row, int done, int total, long nowNs) {
        double elapsedS = (nowNs - startNs) / 1e9;
        int doneHere = done - startDone;
        String eta = doneHere > 0 ? clock(elapsedS / doneHere * (total - done)) : "--:--";
        return String.format(Locale.ROOT, "[%d/%d] %3.0f%%  %s  %s %s %s, bias %s %s  elapsed %s  ETA %s", done, total,
                100.0 * done / total, row.step(), hz(row.frequencyHz()), num(row.level()), row.drive(),
                num(row.bias()), row.biasMode(), clock(elapsedS), eta);
    }

    static String clock(double seconds) {
        Duration d = Duration.ofSeconds(Math.round(seconds));
        return d.toHours() > 0 ? String.format(Locale.ROOT, "%d:%02d:%02d", d.toHours(), d.toMinutesPart(),
                d.toSecondsPart()) : String.format(Locale.ROOT, "%02d:%02d", d.toMinutesPart(), d.toSecondsPart());
    }

    static String hz(double f) {
        if (f >= 1e6) {
            return num(f / 1e6) + " MHz";
        }
        if (f >= 1e3) {
            return num(f / 1e3) + " kHz";
        }
        return num(f) + " Hz";
    }

    static String num(double v) {
        String s = String.format(Locale.ROOT, "%.4g", v);
        int e = s.indexOf('e');
        String mantissa = e < 0 ? s : s.substring(0, e);
        if (mantissa.contains(".")) {
            mantissa = mantissa.replaceAll("0+$", "");
            if (mantissa.endsWith(".")) {
                mantissa = mantissa.substring(0, mantissa.length() - 1);
            }
        }
        return mantissa + (e < 0 ? "" : s.substring(e));
    }
}
