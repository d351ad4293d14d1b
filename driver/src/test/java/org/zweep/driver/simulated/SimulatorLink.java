package org.zweep.driver.simulated;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import org.zweep.driver.dialect.DialectMeter;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiError;
import org.zweep.driver.scpi.ScpiSession;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.driver.transport.Transport;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.InMemoryConnection;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;
import org.zweep.simulator.hislip.HislipOptions;
import org.zweep.simulator.hislip.HislipServer;
import org.zweep.simulator.vxi11.Vxi11Options;
import org.zweep.simulator.vxi11.Vxi11Server;

/**
 * A simulator server on one bench and a {@link ScpiClient} connected to it, over loopback TCP,
 * an in-memory stream pair, VXI-11 (the simulator's own portmapper and core channel) or HiSLIP; every message the client sends is recorded.
 */
final class SimulatorLink implements AutoCloseable {

    /** How the client reaches the simulator. */
    enum Kind { TCP, IN_MEMORY, VXI11, HISLIP }

    /** Short read timeouts for the fault tests. */
    static final ScpiSettings FAST = ScpiSettings.builder().readTimeout(java.time.Duration.ofMillis(400)).build();

    final SimulatorServer server;
    /** The VXI-11 front of {@link #server} (its own portmapper on a free port), or null for other kinds. */
    final Vxi11Server vxi11;
    /** The HiSLIP front of {@link #server} (on a free port), or null for other kinds. */
    final HislipServer hislip;
    final ScpiClient client;
    final Recording session;
    private final Kind kind;
    private final List<ScpiClient> others = new ArrayList<>();
    private final ScpiClient probe;

    private SimulatorLink(SimulatorServer server, Kind kind, ScpiSettings settings) {
        this.server = server;
        this.kind = kind;
        this.vxi11 = kind == Kind.VXI11 ? startVxi11(server) : null;
        this.hislip = kind == Kind.HISLIP ? startHislip(server) : null;
        this.client = connect(settings);
        this.session = new Recording(client);
        // opened now: its *CLS would clear the shared error queue later; and waited for, since on a
        // loaded machine the server may execute a connection's *CLS after the test has injected an
        // error on another one (a write does not wait for its execution; *OPC? answers after it)
        this.probe = another();
        this.probe.query("*OPC?");
    }

    /** A server on {@code bench} with no timing (points take no time), reached over {@code kind}. */
    static SimulatorLink open(Kind kind, BenchSpec bench) {
        return open(kind, bench, options(TimingModel.NONE), ScpiSettings.DEFAULTS);
    }

    static SimulatorLink open(Kind kind, BenchSpec bench, ServerOptions options, ScpiSettings settings) {
        try {
            return new SimulatorLink(SimulatorServer.start(new SimulatedBench(bench), options), kind, settings);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static Vxi11Server startVxi11(SimulatorServer server) {
        try {
            return Vxi11Server.start(server, Vxi11Options.defaults());
        } catch (IOException e) {
            server.close();
            throw new UncheckedIOException(e);
        }
    }

    private static HislipServer startHislip(SimulatorServer server) {
        try {
            return HislipServer.start(server, HislipOptions.defaults());
        } catch (IOException e) {
            server.close();
            throw new UncheckedIOException(e);
        }
    }

    /** The HiSLIP address of the simulator (a free port). */
    String hislipAddress() {
        return "hislip://127.0.0.1:" + hislip.port() + "/hislip0";
    }

    /** The VXI-11 address of the simulator (portmapper on a free port). */
    String vxi11Address() {
        return "vxi11://127.0.0.1:" + vxi11.portmapperPort() + "/inst0";
    }

    /** Loopback TCP on a free port, with {@code timing}. */
    static ServerOptions options(TimingModel timing) {
        return ServerOptions.defaults().withPort(0).withInstrument(InstrumentOptions.defaults().withTiming(timing));
    }

    /** The address a TCP client opens. */
    String tcpAddress() {
        return "tcp://127.0.0.1:" + server.port();
    }

    /** Another client on the same simulator (shared instrument state), closed with this link. */
    ScpiClient another() {
        ScpiClient c = connect(ScpiSettings.DEFAULTS);
        others.add(c);
        return c;
    }

    private ScpiClient connect(ScpiSettings settings) {
        if (kind == Kind.TCP) {
            return ScpiClient.open(tcpAddress(), settings);
        }
        if (kind == Kind.VXI11) {
            return ScpiClient.open(vxi11Address(), settings);
        }
        if (kind == Kind.HISLIP) {
            return ScpiClient.open(hislipAddress(), settings);
        }
        InMemoryConnection c = server.connectInMemory();
        return ScpiClient.connect(Transport.ofStreams(c.input(), c.output(), "sim:in-memory"), settings);
    }

    /** The {@code standard} dialect over the recorded session. */
    DialectMeter standardMeter() {
        return DialectMeter.open(session, "standard");
    }

    /** Asserts that the simulator's error queue is empty, read over a second connection. */
    void assertNoErrors(String after) {
        assertEquals(List.of(), probe().drainErrors(), "the simulator's error queue after " + after);
    }

    /** A second connection for looking at the simulator's state, opened with the link. */
    ScpiClient probe() {
        return probe;
    }

    @Override
    public void close() {
        client.close();
        others.forEach(ScpiClient::close);
        if (vxi11 != null) {
            vxi11.close();
        }
        if (hislip != null) {
            hislip.close();
        }
        server.close();
    }

    /** A session that records every message sent through it, then passes it on. */
    static final class Recording implements ScpiSession {
        private final ScpiSession inner;
        private final List<String> sent = Collections.synchronizedList(new ArrayList<>());

        Recording(ScpiSession inner) {
            this.inner = inner;
        }

        /** Every message sent so far, in order. */
        List<String> sent() {
            return List.copyOf(sent);
        }

        @Override
        public String address() {
            return inner.address();
        }

        @Override
        public void write(String message) {
            sent.add(message);
            inner.write(message);
        }

        @Override
        public String query(String message) {
            sent.add(message);
            return inner.query(message);
        }

        @Override
        public byte[] queryBlock(String message) {
            sent.add(message);
            return inner.queryBlock(message);
        }

        @Override
        public BlocksReply queryBlocksThenText(String message, int blocks, java.time.Duration expectedWork) {
            sent.add(message);
            return inner.queryBlocksThenText(message, blocks, expectedWork);
        }

        @Override
        public List<ScpiError> drainErrors() {
            return inner.drainErrors();
        }

        @Override
        public void close() {
            inner.close();
        }
    }
}
