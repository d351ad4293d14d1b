package org.zweep.runner.live;

import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.engine.ProgressListener;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.text.Figures;
import org.zweep.driver.impedance.Unit;

/**
 * A {@link ProgressListener} that records the run in {@link EventLog} ({@code run_started},
 * {@code step_started}, {@code point} with its values, {@code note}, {@code reconnect}) and passes
 * every call on to the listener it wraps (the terminal's progress line).
 */
public final class EventRecorder implements ProgressListener {
    private final EventLog log;
    private final ProgressListener next;
    private final DerivedParameter main;
    private final String runName;
    private int lastStep = -1;

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
        Impedance z = row.okImpedance() ? row.impedance() : null;
        log.write("point", n -> {
            n.put("point", row.point());
            n.put("step", row.step());
            n.put("step_index", row.stepIndex());
            n.put("repeat", row.repeat());
            n.put("quantity", row.quantity());
            n.put("wiring", row.wiring());
            n.put("frequency_hz", row.frequencyHz());
            n.put("level", row.level());
            n.put("drive", row.driveMode());
            n.put("bias", row.bias());
            n.put("bias_mode", row.biasMode());
            n.put("status", row.status());
            n.put("check", row.check());
            n.put("measured_ms", row.time().toEpochMilli());
            if (z != null) {
                n.put("z_ohm", row.value("z_ohm"));
                n.put("theta_deg", row.value("theta_deg"));
                n.put("r_ohm", row.rOhm());
                n.put("x_ohm", row.xOhm());
                n.put(main.key(), row.value(main.key()));
            }
            if (Double.isFinite(row.ratio())) {
                n.put("ratio", row.ratio());
            }
            n.put("setting_text", Figures.format(row.frequencyHz(), Unit.HERTZ) + ", "
                    + Figures.format(row.level(), Figures.unit(row.driveMode())) + " rms, bias "
                    + Figures.format(row.bias(), Figures.unit(row.biasMode())));
            if (z != null) {
                n.put("values_text", "|Z| " + Figures.format(row.value("z_ohm"), Unit.OHM) + ", θ "
                        + Figures.format(row.value("theta_deg"), Unit.DEGREE) + ", " + main.label() + " "
                        + Figures.format(row.value(main.key()), main.unit()));
            } else if (Double.isFinite(row.ratio())) {
                n.put("values_text", "V2/V1 " + Figures.number(row.ratio(), 5));
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
