package org.zweep.runner.engine;

import org.zweep.driver.impedance.Unit;
import org.zweep.runner.text.Figures;
import java.io.PrintWriter;
import java.time.Duration;
import java.util.Locale;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.IntSupplier;
import java.util.function.LongSupplier;
import org.zweep.runner.results.PointRow;

/**
 * Progress on a console: points done and total, elapsed time, the time left ({@link Eta}, from
 * the run's {@link RunEstimate}) and what is being done now (the current point's setting, or a
 * compensation standard or bias ramp with its own time left). On a terminal one line redrawn in
 * place about twice a second, never wider than the terminal (its width is asked at each redraw);
 * otherwise a plain line every {@code plainIntervalS} seconds (not at each point: the rows of a
 * list sweep arrive together), also while a long piece of work runs, and one when the last point
 * is done. Thread-safe: a daemon thread redraws between events; {@link #finished()} stops it.
 */
public final class ConsoleProgress implements ProgressListener {
    /** The width assumed when the terminal does not say. */
    static final int DEFAULT_WIDTH = 80;
    private static final long TERMINAL_TICK_MS = 500;

    private final PrintWriter out;
    private final boolean terminal;
    private final LongSupplier nanoClock;
    private final double plainIntervalS;
    private final IntSupplier width;
    private final Eta eta;
    private final long beginNs;
    private ScheduledExecutorService ticker;
    private long lastPrintNs;
    private int lastLength;
    private int done;
    private int total;
    private String detail = "starting";
    private String work;
    private double workExpectedS;
    private long workStartNs;
    private boolean active;
    private boolean measuredAny;

    /**
     * A progress display that redraws by itself between events (call {@link #finished()} at the end).
     *
     * @param out where to print
     * @param terminal whether {@code out} is a terminal (redraw one line) or not (plain lines)
     * @param nanoClock a monotonic clock in nanoseconds ({@code System::nanoTime})
     * @param plainIntervalS the least time between two plain lines, in seconds
     * @param estimate the run's estimate (its points in plan order)
     * @param width the terminal's width in columns, asked at each redraw (0 or less: {@value #DEFAULT_WIDTH})
     */
    public ConsoleProgress(PrintWriter out, boolean terminal, LongSupplier nanoClock, double plainIntervalS,
            RunEstimate estimate, IntSupplier width) {
        this(out, terminal, nanoClock, plainIntervalS, estimate, width, true);
    }

    /** As the public constructor; {@code tick} false leaves all drawing to the events (for tests). */
    ConsoleProgress(PrintWriter out, boolean terminal, LongSupplier nanoClock, double plainIntervalS,
            RunEstimate estimate, IntSupplier width, boolean tick) {
        this.out = out;
        this.terminal = terminal;
        this.nanoClock = nanoClock;
        this.plainIntervalS = plainIntervalS;
        this.width = width;
        this.eta = new Eta(estimate);
        this.total = estimate.points().size();
        this.beginNs = nanoClock.getAsLong();
        this.lastPrintNs = beginNs;
        eta.begin(beginNs);
        active = true;
        if (tick) {
            ticker = Executors.newSingleThreadScheduledExecutor(r -> {
                Thread t = new Thread(r, "zweep-progress");
                t.setDaemon(true);
                return t;
            });
            long period = terminal ? TERMINAL_TICK_MS : Math.max(100, (long) (plainIntervalS * 1000));
            ticker.scheduleAtFixedRate(this::tick, period, period, TimeUnit.MILLISECONDS);
        }
    }

    @Override
    public synchronized void started(int total, int done) {
        this.total = total;
        this.done = done;
        long now = nanoClock.getAsLong();
        eta.pointsStart(done, now);
        work = null;
        detail = "measuring";
        clearLine();
        out.println(done == 0 ? "measuring " + total + " points" : "resuming: " + done + " of " + total
                + " points already measured");
        out.flush();
    }

    @Override
    public synchronized void measured(PointRow row, int done, int total) {
        long now = nanoClock.getAsLong();
        this.done = done;
        this.total = total;
        eta.measured(row.point(), now);
        work = null;
        measuredAny = true;
        detail = row.step() + "  " + hz(row.frequencyHz()) + " " + Figures.format(row.level(), Figures.unit(row.driveMode()))
                + ", bias " + Figures.format(row.bias(), Figures.unit(row.biasMode()));
        if (terminal) {
            redraw(now);
        } else if (done == total) {
            printPlain(now);
        }
    }

    @Override
    public synchronized void work(String what, double expectedS) {
        long now = nanoClock.getAsLong();
        work = what;
        workExpectedS = expectedS;
        workStartNs = now;
        if (terminal) {
            redraw(now);
        } else if (expectedS >= plainIntervalS) {
            printPlain(now);
        }
    }

    @Override
    public synchronized void note(String line) {
        clearLine();
        out.println(line);
        if (terminal && active) {
            redraw(nanoClock.getAsLong());
        }
        out.flush();
    }

    @Override
    public synchronized void finished() {
        active = false;
        if (ticker != null) {
            ticker.shutdownNow();
        }
        if (terminal && lastLength > 0) {
            out.println();
            lastLength = 0;
        }
        out.flush();
    }

    /** The time left now, in s (what the display shows). */
    public synchronized double remainingS() {
        return eta.remainingS(nanoClock.getAsLong());
    }

    private synchronized void tick() {
        if (!active) {
            return;
        }
        long now = nanoClock.getAsLong();
        if (terminal) {
            redraw(now);
        } else if ((now - lastPrintNs) / 1e9 >= plainIntervalS - 0.05) {
            printPlain(now);
        }
    }

    private void printPlain(long now) {
        out.println(status(now, Integer.MAX_VALUE));
        out.flush();
        lastPrintNs = now;
    }

    private void redraw(long now) {
        int w = width.getAsInt();
        String line = status(now, (w > 0 ? w : DEFAULT_WIDTH) - 1);
        String pad = line.length() < lastLength ? " ".repeat(lastLength - line.length()) : "";
        out.print("\r" + line + pad);
        out.flush();
        lastLength = line.length();
    }

    private void clearLine() {
        if (terminal && lastLength > 0) {
            out.print("\r" + " ".repeat(lastLength) + "\r");
            lastLength = 0;
        }
    }

    /** One status line of at most {@code max} characters: counts, times, then what is being done. */
    String status(long nowNs, int max) {
        double elapsedS = (nowNs - beginNs) / 1e9;
        int pct = total == 0 ? 100 : (int) Math.floor(100.0 * done / total);
        String head = String.format(Locale.ROOT, "[%d/%d] %d%%  ETA %s  elapsed %s", done, total, pct,
                clock(eta.remainingS(nowNs)), clock(elapsedS));
        String now = detail;
        if (work != null) {
            double left = workExpectedS - (nowNs - workStartNs) / 1e9;
            if (left > 0) {
                now = work + " (" + clock(left) + " left)";
            } else if (!measuredAny) {
                now = work;
            }
        }
        return fit(head + "  " + now, max);
    }

    /** {@code s} cut to {@code max} characters, with an ellipsis where it was cut. */
    static String fit(String s, int max) {
        if (s.length() <= max) {
            return s;
        }
        return max <= 1 ? s.substring(0, Math.max(0, max)) : s.substring(0, max - 1) + "…";
    }

    static String clock(double seconds) {
        Duration d = Duration.ofSeconds(Math.round(seconds));
        return d.toHours() > 0 ? String.format(Locale.ROOT, "%d:%02d:%02d", d.toHours(), d.toMinutesPart(),
                d.toSecondsPart()) : String.format(Locale.ROOT, "%02d:%02d", d.toMinutesPart(), d.toSecondsPart());
    }

    static String hz(double f) {
        return Figures.format(f, Unit.HERTZ);
    }

    /** A plain number for people, at most 4 significant digits. */
    static String num(double v) {
        return Figures.number(v, 4);
    }
}
