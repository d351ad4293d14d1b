package org.zweep.runner.sim;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.SimAddress;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSession;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.driver.transport.Transport;
import org.zweep.simulator.SimulatorInputException;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.InMemoryConnection;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * One simulated meter in this process, loaded from a bench file, served to any number of
 * in-memory connections (each like a TCP connection: own parser, faults, noise-key counter).
 *
 * <p>The address form is {@code sim:BENCH_FILE[?timing=real|none][&seed=N][&part=SERIAL]}: without
 * {@code timing} the bench file's own timing model is used, without {@code seed} its own seed;
 * {@code part} (URL-encoded) puts that part of the bench's {@code parts} in the fixture. Thread-safe;
 * {@link #close()} stops the meter.
 */
public final class InProcessSimulator implements AutoCloseable {
    private final String address;
    private final SimulatorServer server;
    private final BenchSpec spec;

    private InProcessSimulator(String address, SimulatorServer server, BenchSpec spec) {
        this.address = address;
        this.server = server;
        this.spec = spec;
    }

    /**
     * Loads the bench named by a {@code sim:} address and starts its meter.
     *
     * @throws InvalidInputException when the address's bench file (none: {@link #defaultBench()}) is missing or
     *     invalid, {@code timing} is not {@code real} or {@code none}, or {@code seed} not a whole number
     */
    public static InProcessSimulator start(String address) {
        BenchSpec spec = spec(address);
        InstrumentOptions io = InstrumentOptions.defaults()
                .withTiming(spec.timing() == Timing.REAL ? TimingModel.REAL : TimingModel.NONE);
        try {
            return new InProcessSimulator(address,
                    SimulatorServer.start(new SimulatedBench(spec), ServerOptions.defaults().withTcp(false)
                            .withInstrument(io)), spec);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The bench a {@code sim:} address names, with its {@code timing} and {@code seed} options applied. */
    static BenchSpec spec(String address) {
        Address a = Address.parse(address);
        if (!(a instanceof SimAddress sim)) {
            throw new InvalidInputException("address '" + address + "': not a sim: address");
        }
        String bench = sim.bench();
        Timing timing = null;
        Long seed = null;
        String part = null;
        int q = bench.indexOf('?');
        if (q >= 0) {
            String query = bench.substring(q + 1);
            bench = bench.substring(0, q);
            for (String kv : query.split("&")) {
                String[] p = kv.split("=", 2);
                if (p.length == 2 && p[0].equals("timing")) {
                    timing = switch (p[1].toLowerCase(Locale.ROOT)) {
                        case "real" -> Timing.REAL;
                        case "none" -> Timing.NONE;
                        default -> throw new InvalidInputException("address '" + address + "': timing must be real"
                                + " or none, not '" + p[1] + "'");
                    };
                } else if (p.length == 2 && p[0].equals("seed")) {
                    seed = seed(address, p[1]);
                } else if (p.length == 2 && p[0].equals("part") && !p[1].isEmpty()) {
                    part = java.net.URLDecoder.decode(p[1], java.nio.charset.StandardCharsets.UTF_8);
                } else {
                    throw new InvalidInputException("address '" + address + "': unknown option '" + kv
                            + "' (sim:BENCH_FILE[?timing=real|none][&seed=N][&part=SERIAL])");
                }
            }
        }
        BenchSpec spec;
        if (bench.isBlank()) {
            spec = defaultBench();
        } else {
            Path file = Path.of(bench);
            if (!Files.isRegularFile(file)) {
                throw new InvalidInputException("address '" + address + "': bench file not found: " + file);
            }
            try {
                spec = BenchSpec.load(file);
            } catch (SimulatorInputException e) {
                throw new InvalidInputException(e.getMessage(), e);
            }
        }
        if (timing != null) {
            spec = spec.withTiming(timing);
        }
        if (seed != null) {
            spec = spec.withSeed(seed);
        }
        if (part != null) {
            spec = spec.forPart(part);
        }
        return spec;
    }

    /** The {@code seed} option's value. */
    static long seed(String address, String text) {
        try {
            long v = Long.parseLong(text);
            if (Math.abs(v) <= 1L << 53) {
                return v;
            }
        } catch (NumberFormatException e) {
            // said below
        }
        throw new InvalidInputException("address '" + address + "': seed must be a whole number within ±2^53, not '"
                + text + "'");
    }

    /** Whether the simulated meter takes real time ({@code timing real}). */
    public boolean timed() {
        return spec.timing() == Timing.REAL;
    }

    /** The seed its noise is drawn from. */
    public long seed() {
        return spec.seed();
    }

    /** The bench of {@code sim:} without a file and of {@code zweep sim} without options: a 100 Ω resistor. */
    public static BenchSpec defaultBench() {
        return BenchSpec.ofNetlist("R1 hi lo 100", "the default 100 ohm resistor");
    }

    /** The address it was started from. */
    public String address() {
        return address;
    }

    /** The simulator server (for tests that inspect the meter's own state). */
    public SimulatorServer server() {
        return server;
    }

    /** A new in-memory connection as a byte transport (see {@link #transport}). */
    public Transport connectTransport() {
        return transport(server.connectInMemory(), address);
    }

    /**
     * A byte transport over an in-memory simulator connection whose reads wait on the caller's
     * thread, with no pump thread between the simulator's reply and the client.
     *
     * @param name the name used in messages, e.g. the address
     */
    public static Transport transport(InMemoryConnection connection, String name) {
        return Transport.of(connection::read, connection.output(), name, connection::close);
    }

    /** A new in-memory connection as a SCPI session. */
    public ScpiSession connect(ScpiSettings settings) {
        return ScpiClient.connect(connectTransport(), settings);
    }

    /** Stops the simulated meter; never throws. */
    @Override
    public void close() {
        server.close();
    }
}
