package org.zweep.runner.live;

import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.runner.engine.ProgressListener;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.text.Figures;
import org.zweep.driver.impedance.Unit;

/**
 * A {@link ProgressListener} that records the run in {@link EventLog} ({@code run_started},
 * {@code step_started}, {@code point} with what a viewer plots and shows, {@code note},
 * {@code reconnect}) and passes every call on to the listener it wraps (the terminal's progress
 * line). A point event is not the row ({@code points.csv} has that): its setting, |Z|, θ and the
 * main value, its texts for people on at most ten points a second and on the last.
 */
public final class EventRecorder implements ProgressListener {
    private final EventLog log;
    private final ProgressListener next;
    private final DerivedParameter main;
    private final String runName;
    private int lastStep = -1;
    /** At most ten points a second carry texts for people. */
    static final long TEXT_EVERY_NANOS = 100_000_000L;
    private long lastTextNanos = System.nanoTime() - TEXT_EVERY_NANOS;

    /**
     * @param log where the events go
     * @param next the listener to pass calls on to
     * @param main the part's main parameter (Cs, Ls or Rs), sent with every point
     * @param runName the sequence's name
     */
    public EventRecorder(EventLog log, ProgressListener next, DerivedParameter main, String runName) {
        this.log = log;
        this.next = next;
        this.main = main;
        this.runName = runName;
    }

    @Override
    public void started(int total, int done) {
        lastStep = -1;
        log.write("run_started", n -> {
            n.put("name", runName);
            n.put("total", total);
            n.put("done", done);
            n.put("main_parameter", main.key());
            n.put("main_label", main.label());
            n.put("main_unit", main.unit().symbol());
        });
        next.started(total, done);
    }

    @Override
    public void measured(PointRow row, int done, int total) {
        if (row.stepIndex() != lastStep) {
            lastStep = row.stepIndex();
            log.write("step_started", n -> {
                n.put("step", row.step());
                n.put("step_index", row.stepIndex());
            });
        }
        boolean z = row.okImpedance();
        // the texts for people: for at most ten points a second, and the run's last (a viewer shows
        // the latest it has); every point's values, for the plots, in the fields
        long now = System.nanoTime();
        boolean texts = done >= total || now - lastTextNanos >= TEXT_EVERY_NANOS;
        if (texts) {
            lastTextNanos = now;
        }
        log.write("point", n -> {
            n.put("point", row.point());
            n.put("step", row.step());
            n.put("wiring", row.wiring());
            n.put("frequency_hz", row.frequencyHz());
            n.put("level", row.level());
            n.put("drive", row.driveMode());
            n.put("bias", row.bias());
            n.put("bias_mode", row.biasMode());
            n.put("status", row.status());
            if (!row.check().isEmpty()) {
                n.put("check", row.check());
            }
            n.put("measured_ms", row.time().toEpochMilli());
            if (z) {
                // to plot: single precision is more than a screen shows (the row has every digit)
                n.put("z_ohm", (float) row.value("z_ohm"));
                n.put("theta_deg", (float) row.value("theta_deg"));
                n.put(main.key(), (float) row.value(main.key()));
            }
            if (Double.isFinite(row.ratio())) {
                n.put("ratio", row.ratio());
            }
            if (texts) {
                n.put("setting_text", Figures.format(row.frequencyHz(), Unit.HERTZ) + ", "
                        + Figures.format(row.level(), Figures.unit(row.driveMode())) + " rms, bias "
                        + Figures.format(row.bias(), Figures.unit(row.biasMode())));
                if (z) {
                    n.put("values_text", "|Z| " + Figures.format(row.value("z_ohm"), Unit.OHM) + ", θ "
                            + Figures.format(row.value("theta_deg"), Unit.DEGREE) + ", " + main.label() + " "
                            + Figures.format(row.value(main.key()), main.unit()));
                } else if (Double.isFinite(row.ratio())) {
                    n.put("values_text", "V2/V1 " + Figures.number(row.ratio(), 5));
                }
            }
            n.put("done", done);
            n.put("total", total);
        });
        next.measured(row, done, total);
    }

    @Override
    public void work(String what, double expectedS) {
        next.work(what, expectedS);
    }

    @Override
    public void note(String line) {
        log.write(line.contains("reconnect") ? "reconnect" : "note", n -> n.put("text", line));
        next.note(line);
    }

    @Override
    public void finished() {
        next.finished();
    }
}
