package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
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
 * behind the next point) and came out 35 % above the run.
 */
class EstimateOnePointOneMessageIT {
    @TempDir
    Path dir;

    private double[] estimateAndWall(Path seq) {
        double estimateS = RunEstimate.of(SequenceLoader.load(seq)).totalS();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        long t0 = System.nanoTime();
        int code = Cli.run(new String[] {"run", seq.toString(), "--yes", "--quiet", "--no-index", "--out",
            dir.resolve("run-" + seq.getFileName()).toString()}, new PrintWriter(out), new PrintWriter(err));
        double wallS = (System.nanoTime() - t0) / 1e9;
        assertTrue(code == 0 || code == 1, out + "\n" + err);
        assertTrue(out.toString().contains("(completed)"), out.toString());
        double error = (estimateS - wallS) / wallS;
        System.out.printf(Locale.ROOT, "in-process, real timing, %s: wall %.2f s, estimate %.2f s (%+.1f %%)%n",
                seq.getFileName(), wallS, estimateS, 100 * error);
        return new double[] {estimateS, wallS, error};
    }

    @Test
    void shippedSequenceTakesWithinFifteenPercentOfItsEstimate() {
        double[] r = estimateAndWall(Sims.sequences().resolve("transformer-kp-t2010.yaml"));
        assertTrue(Math.abs(r[2]) <= 0.15, String.format(Locale.ROOT, "wall %.2f s, estimate %.2f s", r[1], r[0]));
    }

    @Test
    void pointByPointStepTakesWithinFifteenPercentOfItsEstimate() throws Exception {
        Path bench = Files.copy(Sims.benchOf(Sims.sequences().resolve("incoming-kp-c0805-104.yaml")),
                dir.resolve("c.bench.yaml"));
        Path seq = dir.resolve("levels.yaml");
        // the level changes every point: no list sweep, 300 points of one message each, 22 ms of the meter's
        // (point-overhead 2 ms + integration 20 ms); the old count (2 round trips and a 10 ms sync a point)
        // put the estimate 35 % above the run
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
        double[] r = estimateAndWall(seq);
        assertEquals(300, RunEstimate.of(SequenceLoader.load(seq)).points().size());
        assertTrue(Math.abs(r[2]) <= 0.15, String.format(Locale.ROOT, "wall %.2f s, estimate %.2f s", r[1], r[0]));
    }
}
