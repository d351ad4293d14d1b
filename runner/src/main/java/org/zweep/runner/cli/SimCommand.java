package org.zweep.runner.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.net.InetAddress;
import java.net.UnknownHostException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.MeterException;
import org.zweep.simulator.SimulatorInputException;
import org.zweep.runner.sim.InProcessSimulator;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.scpi.BenchLoader;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.hislip.HislipOptions;
import org.zweep.simulator.server.ListenerOptions;
import org.zweep.simulator.hislip.HislipServer;
import org.zweep.simulator.server.SimulatorServer;
import org.zweep.simulator.vxi11.Vxi11Options;
import org.zweep.simulator.vxi11.Vxi11Server;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code zweep sim}: serves the simulated meter over raw-socket SCPI in the foreground until interrupted. */
@Command(
        name = "sim",
        mixinStandardHelpOptions = true,
        description = {
            "Serves the simulated impedance meter (IEEE 488.2 / SCPI over raw TCP; VXI-11 and HiSLIP on request)"
                    + " in the foreground.",
            "Prints 'listening on tcp://HOST:PORT' once ready, logs connections, stops on Ctrl-C (exit code 130)."},
        footer = {
            "%nFault specs for --fault (repeatable or comma-separated): KIND[=VALUE][@WHEN]",
            "  drop@N  drop-idle=SECONDS  drop-random=P  delay=SECONDS  fragment=BYTES",
            "  stall@N  omit-terminator  error=CODE  garble",
            "  WHEN: N (the N-th only), N+ (from the N-th on), ~P (each with probability P),",
            "  absent (every one). Each connection counts its own messages and replies.",
            ExitCode.HELP_LIST})
public final class SimCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--port", paramLabel = "N", description = "TCP port (default ${DEFAULT-VALUE}; 0 picks a free one).",
            defaultValue = "5025")
    int port;

    @Option(names = "--vxi11-port", paramLabel = "N",
            description = "Also serve over VXI-11: a portmapper on this port (111 is the standard one, which VISA"
                    + " clients look up; 0 picks a free one) and the core channel on a free port registered there.")
    Integer vxi11Port;

    @Option(names = "--hislip-port", paramLabel = "N",
            description = "Also serve over HiSLIP on this port (4880 is the standard one; 0 picks a free one).")
    Integer hislipPort;

    @Option(names = "--hislip-overlapped", description = "HiSLIP in overlapped mode (default: synchronized).")
    boolean hislipOverlapped;

    @Option(names = "--bind", paramLabel = "ADDR",
            description = "Address to listen on (default ${DEFAULT-VALUE}: this machine only).", defaultValue = "127.0.0.1")
    String bind;

    static final class Source {
        @Option(names = "--bench", paramLabel = "FILE", description = "Bench file (YAML) to serve.")
        Path bench;

        @Option(names = "--device", paramLabel = "NETLIST",
                description = "Device netlist: a file, or element lines inline (separated by newlines or \\n).")
        String device;
    }

    @ArgGroup(exclusive = true)
    Source source;

    @Option(names = "--ideal", description = "No noise, no fixture residuals, no lead resistance.")
    boolean ideal;

    @Option(names = "--seed", paramLabel = "N", description = "Seed all noise is drawn from.")
    Long seed;

    @Option(names = "--timing", paramLabel = "real|none",
            description = "real: points take as long as on a real meter; none: as fast as possible"
                    + " (default: the bench file's, else real).")
    String timing;

    @Option(names = "--strict", description = "Strict IEEE 488.2 query rules: -410 when a message interrupts a pending reply.")
    boolean strict;

    @Option(names = "--error-queue", paramLabel = "N", defaultValue = "16",
            description = "Error queue depth before -350 Queue overflow (default ${DEFAULT-VALUE}).")
    int errorQueueDepth;

    @Option(names = "--max-message", paramLabel = "BYTES", defaultValue = "1048576",
            description = "Longest program message accepted; longer gives -363 (default ${DEFAULT-VALUE}).")
    int maxMessageBytes;

    @Option(names = "--max-connections", paramLabel = "N", defaultValue = "256",
            description = "Most TCP connections open at once; one more is told why and closed (default ${DEFAULT-VALUE}).")
    int maxConnections;

    @Option(names = "--bench-dir", paramLabel = "DIR",
            description = "A folder SIMulate:BENCh may load bench files from (repeatable; none: SIMulate:BENCh is refused).")
    List<Path> benchDirs = new ArrayList<>();

    @Option(names = "--fault", paramLabel = "SPEC", description = "Inject a fault on every connection (see below).")
    List<String> faults = new ArrayList<>();

    @Option(names = "--drop-after", paramLabel = "N", description = "Close each connection after its N-th message (= --fault drop@N).")
    Long dropAfter;

    @Option(names = "--drop-idle", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "Close a connection idle this long, e.g. 30s or a number of seconds (= --fault drop-idle=S).")
    Duration dropIdle;

    @Option(names = "--drop-random", paramLabel = "P", description = "Close on each message with probability P (= --fault drop-random=P).")
    String dropRandom;

    @Option(names = "--delay", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "Delay every reply, e.g. 200ms or a number of seconds (= --fault delay=S).")
    Duration delay;

    @Option(names = "--fragment", paramLabel = "BYTES", description = "Send replies in pieces (= --fault fragment=BYTES).")
    Integer fragment;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        BenchSpec benchSpec = benchSpec();
        String t = timing != null ? timing.toLowerCase(java.util.Locale.ROOT)
                : benchSpec.timing() == Timing.NONE ? "none" : "real";
        TimingModel timingModel = switch (t) {
            case "real" -> TimingModel.REAL;
            case "none" -> TimingModel.NONE;
            default -> throw new InvalidInputException("--timing: '" + timing + "' is not real or none");
        };
        if (seed != null) {
            benchSpec = benchSpec.withSeed(seed);
        }
        if (ideal) {
            benchSpec = benchSpec.ideal();
        }
        benchSpec = benchSpec.withTiming(timingModel == TimingModel.REAL ? Timing.REAL : Timing.NONE);
        FaultPlan plan = faultPlan(benchSpec.seed());
        InetAddress address;
        try {
            address = InetAddress.getByName(bind);
        } catch (UnknownHostException e) {
            throw new InvalidInputException("--bind: unknown address '" + bind + "'");
        }
        if (errorQueueDepth < 2) {
            throw new InvalidInputException("--error-queue: must be at least 2, got " + errorQueueDepth);
        }
        if (maxConnections < 1) {
            throw new InvalidInputException("--max-connections: must be at least 1, got " + maxConnections);
        }
        for (Path d : benchDirs) {
            if (!Files.isDirectory(d)) {
                throw new InvalidInputException("--bench-dir: " + d + " is not a folder");
            }
        }
        ServerOptions options;
        try {
            options = ServerOptions.defaults().withBindAddress(address).withPort(port).withMaxMessageBytes(maxMessageBytes)
                    .withMaxConnections(maxConnections).withFaults(plan)
                    .withInstrument(InstrumentOptions.defaults().withTiming(timingModel).withStrict(strict)
                            .withErrorQueueDepth(errorQueueDepth).withBenchLoader(BenchLoader.simulated(ideal, timingModel, benchDirs)))
                    .withLog(line -> {
                        synchronized (out) {
                            out.println(line);
                            out.flush();
                        }
                    });
        } catch (IllegalArgumentException e) {
            throw new InvalidInputException(e.getMessage());
        }
        if (vxi11Port != null && (vxi11Port < 0 || vxi11Port > 65535)) {
            throw new InvalidInputException("--vxi11-port: must be 0..65535, got " + vxi11Port);
        }
        SimulatorServer server;
        try {
            server = SimulatorServer.start(new SimulatedBench(benchSpec), options);
        } catch (IOException e) {
            throw new MeterException(e.getMessage(), e);
        }
        Vxi11Server vxi11 = null;
        if (vxi11Port != null) {
            try {
                vxi11 = Vxi11Server.start(server, Vxi11Options.defaults()
                        .withPortmapper(new ListenerOptions(address, vxi11Port, options.log())));
            } catch (IOException e) {
                server.close();
                throw new MeterException(e.getMessage(), e);
            }
        }
        HislipServer hislip = null;
        if (hislipPort != null) {
            if (hislipPort < 0 || hislipPort > 65535) {
                if (vxi11 != null) {
                    vxi11.close();
                }
                server.close();
                throw new InvalidInputException("--hislip-port: must be 0..65535, got " + hislipPort);
            }
            try {
                hislip = HislipServer.start(server, HislipOptions.defaults()
                        .withListener(new ListenerOptions(address, hislipPort, options.log())).withOverlapped(hislipOverlapped));
            } catch (IOException e) {
                if (vxi11 != null) {
                    vxi11.close();
                }
                server.close();
                throw new MeterException(e.getMessage(), e);
            }
        }
        Vxi11Server lan = vxi11;
        HislipServer hs = hislip;
        CountDownLatch stopped = new CountDownLatch(1);
        Thread hook = new Thread(() -> {
            if (hs != null) {
                hs.close();
            }
            if (lan != null) {
                lan.close();
            }
            server.close();
            stopped.countDown();
        }, "zweep-sim-shutdown");
        Runtime.getRuntime().addShutdownHook(hook);
        synchronized (out) {
            out.println("listening on tcp://" + server.address().getAddress().getHostAddress() + ":" + server.port()
                    + " (" + benchSpec.description() + ")");
            if (lan != null) {
                String host = server.address().getAddress().getHostAddress();
                out.println("listening on vxi11://" + host + ":" + lan.portmapperPort() + "/inst0 (portmapper; core"
                        + " channel on port " + lan.corePort() + ")" + (lan.portmapperPort() == 111
                        ? ", VISA: TCPIP::" + host + "::INSTR" : ""));
            }
            if (hs != null) {
                String host = server.address().getAddress().getHostAddress();
                out.println("listening on hislip://" + host + ":" + hs.port() + "/hislip0 ("
                        + (hislipOverlapped ? "overlapped" : "synchronized") + " mode), VISA: TCPIP::" + host
                        + "::hislip0" + (hs.port() == 4880 ? "" : "," + hs.port()) + "::INSTR");
            }
            out.flush();
        }
        try {
            stopped.await();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        } finally {
            if (hs != null) {
                hs.close();
            }
            if (lan != null) {
                lan.close();
            }
            server.close();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException e) {
                // already shutting down: the hook is running
            }
        }
        synchronized (out) {
            out.println("stopped");
            out.flush();
        }
        return ExitCode.OK;
    }

    private BenchSpec benchSpec() {
        try {
            if (source != null && source.bench != null) {
                return BenchSpec.load(source.bench);
            }
            if (source != null && source.device != null) {
                Path file = Path.of(source.device);
                if (!source.device.contains("\n") && !source.device.contains("\\n") && Files.isRegularFile(file)) {
                    return BenchSpec.ofNetlistFile(file);
                }
                return BenchSpec.ofNetlist(source.device.replace("\\n", "\n"), "--device");
            }
            return InProcessSimulator.defaultBench();
        } catch (SimulatorInputException e) {
            throw new InvalidInputException(e.getMessage(), e);
        }
    }

    private FaultPlan faultPlan(long faultSeed) {
        List<String> specs = new ArrayList<>(faults);
        if (dropAfter != null) {
            specs.add("drop@" + dropAfter);
        }
        if (dropIdle != null) {
            specs.add("drop-idle=" + seconds(dropIdle));
        }
        if (dropRandom != null) {
            specs.add("drop-random=" + dropRandom);
        }
        if (delay != null) {
            specs.add("delay=" + seconds(delay));
        }
        if (fragment != null) {
            specs.add("fragment=" + fragment);
        }
        try {
            return FaultPlan.parse(String.join(",", specs), faultSeed);
        } catch (IllegalArgumentException e) {
            throw new InvalidInputException("--fault: " + e.getMessage());
        }
    }

    /** {@code d} in seconds as the fault grammar writes them ({@code 0.2}). */
    private static String seconds(Duration d) {
        return java.math.BigDecimal.valueOf(d.toMillis(), 3).stripTrailingZeros().toPlainString();
    }
}
