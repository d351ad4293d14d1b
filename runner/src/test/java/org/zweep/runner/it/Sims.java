package org.zweep.runner.it;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.cli.Cli;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/** Helpers for end-to-end tests: the shipped files, a loopback simulator, the CLI on writers. */
final class Sims {
    private Sims() {
    }

    /** The repository's {@code sequences/} folder (tests run in {@code runner/}). */
    static Path sequences() {
        Path p = Path.of("..", "sequences").toAbsolutePath().normalize();
        if (!Files.isDirectory(p)) {
            throw new IllegalStateException("no sequences folder at " + p);
        }
        return p;
    }

    /** Every shipped sequence file. */
    static List<Path> shippedSequences() {
        try (Stream<Path> s = Files.list(sequences())) {
            return s.filter(p -> p.toString().endsWith(".yaml")).sorted().toList();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The dialect the runs use: the standard one, the simulator's own command tree. */
    static String dialect() {
        return "standard";
    }

    /** The bench file a shipped sequence names (its {@code bench:} line). */
    static Path benchOf(Path sequence) {
        try {
            String line = Files.readAllLines(sequence).stream().filter(l -> l.strip().startsWith("bench:"))
                    .findFirst().orElseThrow();
            return sequence.getParent().resolve(line.strip().substring("bench:".length()).strip()).normalize();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** A loopback TCP simulator for {@code bench} without timing, with {@code faults} on every connection. */
    static SimulatorServer tcp(Path bench, FaultPlan faults) {
        try {
            return SimulatorServer.start(new SimulatedBench(BenchSpec.load(bench)), ServerOptions.defaults().withPort(0)
                    .withFaults(faults).withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * The address a run uses for {@code server}: {@code sim:tcp://127.0.0.1:PORT}, so that the run
     * takes its timing (and its fixture, where the dialect declares none) from the simulator.
     */
    static String address(SimulatorServer server) {
        return "sim:tcp://127.0.0.1:" + server.port();
    }

    /** Whether the simulator's DC bias sources are both off, asked over a new connection. */
    static boolean biasOff(SimulatorServer server) {
        try (ScpiClient c = ScpiClient.open("tcp://127.0.0.1:" + server.port(), ScpiSettings.DEFAULTS)) {
            return c.query(":SOUR:VOLT:OFFS:STAT?").strip().equals("0")
                    && c.query(":SOUR:CURR:OFFS:STAT?").strip().equals("0");
        }
    }

    /** The result of one CLI run. */
    record Result(int code, String out, String err) {
    }

    /** Runs {@code zweep args} in this JVM. */
    static Result zweep(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Cli.run(args, new PrintWriter(out), new PrintWriter(err));
        return new Result(code, out.toString(), err.toString());
    }
}
