package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.cli.Cli;
import org.zweep.runner.engine.RunEstimate;
import org.zweep.runner.sequence.SequenceLoader;

/**
 * The estimate {@code zweep check} prints against the wall time of the run it estimates, on the
 * in-process simulator ({@code sim:BENCH}, the address a shipped sequence names) at its real
 * timing: within 15 % for a shipped sequence, and for a point-by-point step, where the estimate
 * used to count two round trips and a 10 ms sync a point (a point is one message, its row synced
 * behind the next point) and came out 43 % above the step.
 */
class EstimateOnePointOneMessageIT {
    @TempDir
    Path dir;

    /** Runs {@code seq}; its folder. Prints the whole run's wall time against the estimate. */
    private Path run(Path seq, double[] estimateAndWall) {
        double estimateS = RunEstimate.of(SequenceLoader.load(seq)).totalS();
        Path folder = dir.resolve("run-" + seq.getFileName());
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        long t0 = System.nanoTime();
        int code = Cli.run(new String[] {"run", seq.toString(), "--yes", "--quiet", "--no-index", "--out",
            folder.toString()}, new PrintWriter(out), new PrintWriter(err));
        double wallS = (System.nanoTime() - t0) / 1e9;
        assertTrue(code == 0 || code == 1, out + "\n" + err);
        assertTrue(out.toString().contains("(completed)"), out.toString());
        System.out.printf(Locale.ROOT, "in-process, real timing, %s: wall %.2f s, estimate %.2f s (%+.1f %%)%n",
                seq.getFileName(), wallS, estimateS, 100 * (estimateS - wallS) / wallS);
        estimateAndWall[0] = estimateS;
        estimateAndWall[1] = wallS;
        return folder;
    }

    @Test
    void shippedSequenceTakesWithinFifteenPercentOfItsEstimate() {
        double[] r = new double[2];
        run(Sims.sequences().resolve("transformer-kp-t2010.yaml"), r);
        double error = (r[0] - r[1]) / r[1];
        assertTrue(Math.abs(error) <= 0.15, String.format(Locale.ROOT, "wall %.2f s, estimate %.2f s", r[1], r[0]));
    }

    /**
     * The step alone (from its {@code step_started} event to its last point's, in
     * {@code events.jsonl}): the estimate's fixed start (1 s, a fresh process's) would otherwise
     * weigh on a short run in this warm JVM.
     */
    @Test
    void pointByPointStepTakesWithinFifteenPercentOfItsEstimate() throws Exception {
        Path bench = Files.copy(Sims.benchOf(Sims.sequences().resolve("incoming-kp-c0805-104.yaml")),
                dir.resolve("c.bench.yaml"));
        Path seq = dir.resolve("levels.yaml");
        // the level changes every point: no list sweep, 300 points of one message each, 22 ms of the meter's
        // (point-overhead 2 ms + integration 20 ms); the old count (2 round trips and a 10 ms sync a point)
        // put the step's estimate 43 % above it (10.5 s)
        Files.writeString(seq, """
                format: zweep-sequence/1
                name: level-points
                meter: {bench: %s}
                safety: {max_level_voltage: 1 V}
                part: {kind: capacitor, name: KP-C0805-104, nominal: 100 nF}
                steps:
                  - name: level-sweep
                    frequency: 100 kHz
                    level: {start: 0.1 V, stop: 1 V, points: 100}
                    integration: 20 ms
                    repeats: 3
                """.formatted(bench.getFileName()));
        RunEstimate e = RunEstimate.of(SequenceLoader.load(seq));
        assertEquals(300, e.points().size());
        Path folder = run(seq, new double[2]);
        List<String> events = Files.readAllLines(folder.resolve("events.jsonl"));
        long started = -1;
        long last = -1;
        for (String line : events) {
            Matcher m = EVENT.matcher(line);
            if (m.find()) {
                if (m.group(1).equals("step_started")) {
                    started = Long.parseLong(m.group(2));
                } else {
                    last = Long.parseLong(m.group(2));
                }
            }
        }
        assertTrue(started > 0 && last > started, "no step in events.jsonl");
        double stepS = (last - started) / 1e3;
        double estimateS = e.steps().get(0).totalS();
        double error = (estimateS - stepS) / stepS;
        System.out.printf(Locale.ROOT, "in-process, real timing, the point-by-point step: %.2f s, estimate %.2f s"
                + " (%+.1f %%)%n", stepS, estimateS, 100 * error);
        assertTrue(Math.abs(error) <= 0.15, String.format(Locale.ROOT, "step %.2f s, estimate %.2f s", stepS,
                estimateS));
    }

    private static final Pattern EVENT = Pattern.compile("^\\{\"type\":\"(step_started|point)\",\"time_ms\":(\\d+)");
}
