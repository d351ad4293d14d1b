package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.zweep.runner.cli.Cli;
import org.zweep.runner.engine.RunEstimate;
import org.zweep.runner.sequence.SequenceLoader;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Issue 9: every shipped sequence end to end at the simulator's real timing with zweep's default
 * options (only the address points at a loopback simulator, so that its bias can be asked
 * afterwards over a second connection): it completes with every point, leaves the bias off, and
 * takes within 10 % of the time {@code zweep check} estimates; the ETA printed nearest half-way is
 * within 15 % of the time that was really left after it.
 */
class RealTimingRunIT {
    private static final Pattern PROGRESS = Pattern.compile("^\\[(\\d+)/(\\d+)] \\d+%  ETA (\\d+):(\\d\\d)  ");

    @TempDir
    Path dir;

    static Stream<Path> sequences() {
        return Sims.shippedSequences().stream();
    }

    /** A line printed at a moment of the test's clock. */
    private record Line(long nanos, String text) {
    }

    /** Collects the lines printed, each stamped with when its end was written. */
    private static final class StampedLines extends Writer {
        final List<Line> lines = new ArrayList<>();
        private final StringBuilder current = new StringBuilder();

        @Override
        public synchronized void write(char[] cbuf, int off, int len) {
            for (int i = off; i < off + len; i++) {
                char c = cbuf[i];
                if (c == '\n') {
                    lines.add(new Line(System.nanoTime(), current.toString()));
                    current.setLength(0);
                } else {
                    current.append(c);
                }
            }
        }

        @Override
        public void flush() {
        }

        @Override
        public void close() {
        }

        synchronized String text() {
            StringBuilder b = new StringBuilder();
            lines.forEach(l -> b.append(l.text()).append('\n'));
            return b.append(current).toString();
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("sequences")
    void completesWithEveryPointAndBiasOffWithinTenPercentOfTheEstimate(Path seq) throws IOException {
        double estimateS = RunEstimate.of(SequenceLoader.load(seq)).totalS();
        Path out = dir.resolve("results").resolve("run");
        StampedLines lines = new StampedLines();
        StringWriter err = new StringWriter();
        try (SimulatorServer server = start(Sims.benchOf(seq))) {
            long t0 = System.nanoTime();
            int code = Cli.run(new String[] {"run", seq.toString(), "--yes", "--out", out.toString(), "--meter",
                Sims.address(server)}, new PrintWriter(lines, true), new PrintWriter(err, true));
            long t1 = System.nanoTime();
            Sims.Result r = new Sims.Result(code, lines.text(), err.toString());
            ShippedSequencesRunIT.assertCompleteRun(seq, out, r);
            assertTrue(Sims.biasOff(server), "the simulator's own bias state is off");

            double wallS = (t1 - t0) / 1e9;
            double error = (estimateS - wallS) / wallS;
            double etaError = etaErrorAtHalfWay(lines.lines, t0, t1);
            System.out.printf(Locale.ROOT, "real timing %s: wall %.1f s, check's estimate %.1f s (%+.1f %%),"
                    + " ETA at half-way %+.1f %% of the time left%n", seq.getFileName(), wallS, estimateS,
                    100 * error, 100 * etaError);
            assertTrue(Math.abs(error) <= 0.10, String.format(Locale.ROOT,
                    "%s took %.1f s, check estimated %.1f s (%+.1f %%)%n%s", seq.getFileName(), wallS, estimateS,
                    100 * error, r.out()));
            assertTrue(Math.abs(etaError) <= 0.15, String.format(Locale.ROOT,
                    "%s: the ETA at half-way was off by %+.1f %% of the time left%n%s", seq.getFileName(),
                    100 * etaError, r.out()));
        }
    }

    /**
     * The relative error of the ETA on the progress line printed nearest half-way through the run,
     * against the time really left after that line.
     */
    private static double etaErrorAtHalfWay(List<Line> lines, long t0, long t1) {
        long half = t0 + (t1 - t0) / 2;
        Line best = null;
        double etaS = Double.NaN;
        for (Line l : lines) {
            Matcher m = PROGRESS.matcher(l.text());
            if (m.find() && (best == null || Math.abs(l.nanos() - half) < Math.abs(best.nanos() - half))) {
                best = l;
                etaS = Integer.parseInt(m.group(3)) * 60 + Integer.parseInt(m.group(4));
            }
        }
        assertTrue(best != null, "no progress line printed");
        double leftS = (t1 - best.nanos()) / 1e9;
        return (etaS - leftS) / leftS;
    }

    private static SimulatorServer start(Path bench) {
        try {
            return SimulatorServer.start(new SimulatedBench(BenchSpec.load(bench)), ServerOptions.defaults().withPort(0));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
