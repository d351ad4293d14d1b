package org.zweep.bench.driver;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;

/**
 * One {@code *IDN?} round trip over loopback TCP to an {@link EchoPeer}: through the full
 * {@link ScpiClient} (address, transport provider, terminators, lock, resync checks) against a bare
 * blocking-socket loop that writes the query and reads up to LF. Sample mode reports the median
 * (p0.50) of both in one run.
 */
@BenchmarkMode(Mode.SampleTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class QueryRoundTripBenchmark {
    private static final byte[] QUERY = "*IDN?\n".getBytes(StandardCharsets.US_ASCII);

    /** A connected client. */
    @State(Scope.Thread)
    public static class ClientState {
        EchoPeer peer;
        ScpiClient client;

        @Setup(Level.Trial)
        public void open() {
            peer = new EchoPeer();
            client = ScpiClient.open("tcp://127.0.0.1:" + peer.port(),
                    ScpiSettings.builder().clearOnConnect(false).build());
        }

        @TearDown(Level.Trial)
        public void close() throws IOException {
            client.close();
            peer.close();
        }
    }

    /** A bare connected socket, reads without a timeout. */
    @State(Scope.Thread)
    public static class BareState {
        EchoPeer peer;
        Socket socket;
        InputStream in;
        OutputStream out;
        final byte[] buf = new byte[8192];

        @Setup(Level.Trial)
        public void open() throws IOException {
            peer = new EchoPeer();
            socket = new Socket(InetAddress.getLoopbackAddress(), peer.port());
            socket.setTcpNoDelay(true);
            socket.setSoTimeout(timeoutMillis());
            in = socket.getInputStream();
            out = socket.getOutputStream();
        }

        int timeoutMillis() {
            return 0;
        }

        @TearDown(Level.Trial)
        public void close() throws IOException {
            socket.close();
            peer.close();
        }
    }

    /** The same bare socket with a read timeout (SO_TIMEOUT 5 s), as any safe loop needs. */
    @State(Scope.Thread)
    public static class TimedBareState extends BareState {
        @Override
        int timeoutMillis() {
            return 5000;
        }
    }

    @Benchmark
    public String scpiClientQuery(ClientState s) {
        return s.client.query("*IDN?");
    }

    @Benchmark
    public int bareSocketLoop(BareState s) throws IOException {
        return roundTrip(s);
    }

    @Benchmark
    public int bareSocketLoopWithTimeout(TimedBareState s) throws IOException {
        return roundTrip(s);
    }

    private static int roundTrip(BareState s) throws IOException {
        s.out.write(QUERY);
        int total = 0;
        while (true) {
            int n = s.in.read(s.buf, total, s.buf.length - total);
            if (n < 0) {
                throw new IOException("peer closed");
            }
            for (int i = total; i < total + n; i++) {
                if (s.buf[i] == '\n') {
                    return i;
                }
            }
            total += n;
        }
    }
}
