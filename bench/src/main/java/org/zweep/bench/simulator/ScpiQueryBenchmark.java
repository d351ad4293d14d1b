package org.zweep.bench.simulator;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Simple query round trips from one raw-socket client to the simulator over loopback: write the
 * query, read the reply up to its LF. Target: at least 20,000 queries per second.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
public class ScpiQueryBenchmark {
    private static final byte[] IDN = "*IDN?\n".getBytes(StandardCharsets.US_ASCII);
    private static final byte[] FREQ = "SOUR:FREQ?\n".getBytes(StandardCharsets.US_ASCII);

    private SimulatorServer server;
    private Socket socket;
    private InputStream in;
    private OutputStream out;
    private final byte[] buf = new byte[256];

    /** Starts the simulator on a free loopback port and connects one client. */
    @Setup
    public void setUp() throws IOException {
        server = SimulatorServer.start(new SimulatedBench(BenchSpec.ofNetlist("R1 hi lo 100", "benchmark")),
                ServerOptions.defaults().withPort(0)
                        .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        socket = new Socket("127.0.0.1", server.port());
        socket.setTcpNoDelay(true);
        in = socket.getInputStream();
        out = socket.getOutputStream();
    }

    /** Closes the client and the simulator. */
    @TearDown
    public void tearDown() throws IOException {
        socket.close();
        server.close();
    }

    /** {@code *IDN?} and its reply. */
    @Benchmark
    public int identify() throws IOException {
        return roundTrip(IDN);
    }

    /** {@code SOUR:FREQ?} and its reply. */
    @Benchmark
    public int frequency() throws IOException {
        return roundTrip(FREQ);
    }

    private int roundTrip(byte[] query) throws IOException {
        out.write(query);
        out.flush();
        int total = 0;
        while (true) {
            int n = in.read(buf);
            if (n < 0) {
                throw new IOException("simulator closed the connection");
            }
            total += n;
            if (buf[n - 1] == '\n') {
                return total;
            }
        }
    }
}
