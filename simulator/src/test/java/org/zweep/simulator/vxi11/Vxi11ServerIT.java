package org.zweep.simulator.vxi11;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.net.InetAddress;
import java.net.Socket;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TestBench;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * The simulator's VXI-11 server against calls written byte by byte here from RFC 5531 (call and
 * reply headers, record marking), RFC 4506 (XDR), RFC 1833 (portmapper) and VXI-11 rev. 1.0 (the
 * core channel's procedures): the refusals every RPC server owes, a call in several fragments and
 * a whole write/read exchange.
 */
class Vxi11ServerIT {
    private SimulatorServer meter;
    private Vxi11Server server;

    @BeforeEach
    void start() throws IOException {
        meter = SimulatorServer.start(TestBench.resistor(), ServerOptions.defaults().withPort(0)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        server = Vxi11Server.start(meter, Vxi11Options.defaults());
    }

    @AfterEach
    void stop() {
        server.close();
        meter.close();
    }

    /** A call record body: xid, CALL, RPC version, program, version, procedure, AUTH_NONE twice, then args. */
    private static byte[] call(int xid, int rpcVersion, int program, int version, int procedure, int... args) {
        ByteBuffer b = ByteBuffer.allocate(40 + 4 * args.length);
        b.putInt(xid).putInt(0).putInt(rpcVersion).putInt(program).putInt(version).putInt(procedure)
                .putInt(0).putInt(0).putInt(0).putInt(0);
        for (int a : args) {
            b.putInt(a);
        }
        return b.array();
    }

    /** Sends {@code body} as one record cut into fragments of {@code fragment} bytes (RFC 5531 §11). */
    private static void send(DataOutputStream out, byte[] body, int fragment) throws IOException {
        for (int at = 0; at < body.length; at += fragment) {
            int n = Math.min(fragment, body.length - at);
            out.writeInt((at + n == body.length ? 0x80000000 : 0) | n);
            out.write(body, at, n);
            out.flush();
        }
    }

    /** Reads one reply record (any fragments) and returns its words. */
    private static ByteBuffer receive(DataInputStream in) throws IOException {
        byte[] record = new byte[0];
        int mark;
        do {
            mark = in.readInt();
            int at = record.length;
            record = Arrays.copyOf(record, at + (mark & 0x7fffffff));
            in.readFully(record, at, mark & 0x7fffffff);
        } while ((mark & 0x80000000) == 0);
        return ByteBuffer.wrap(record);
    }

    /** Checks an accepted reply's header up to accept_stat and returns it. */
    private static int acceptStat(ByteBuffer r, int xid) {
        assertEquals(xid, r.getInt(), "xid");
        assertEquals(1, r.getInt(), "REPLY");
        assertEquals(0, r.getInt(), "MSG_ACCEPTED");
        r.getInt(); // verifier flavour
        int verifierBytes = r.getInt();
        r.position(r.position() + verifierBytes);
        return r.getInt();
    }

    private Socket connect(int port) throws IOException {
        return new Socket(InetAddress.getLoopbackAddress(), port);
    }

    @Test
    void thePortmapperTellsTheCoreChannelAndRefusesWhatItDoesNotServe() throws IOException {
        try (Socket s = connect(server.portmapperPort())) {
            DataInputStream in = new DataInputStream(s.getInputStream());
            DataOutputStream out = new DataOutputStream(s.getOutputStream());
            // RFC 1833 §3.2: PMAPPROC_GETPORT(prog 0x0607AF, vers 1, IPPROTO_TCP 6, port 0)
            send(out, call(1, 2, 100000, 2, 3, 0x0607AF, 1, 6, 0), 1000);
            ByteBuffer r = receive(in);
            assertEquals(0, acceptStat(r, 1), "SUCCESS");
            assertEquals(server.corePort(), r.getInt());
            // over UDP (17) there is no core channel: port 0
            send(out, call(2, 2, 100000, 2, 3, 0x0607AF, 1, 17, 0), 1000);
            r = receive(in);
            assertEquals(0, acceptStat(r, 2));
            assertEquals(0, r.getInt());
            // RFC 5531 §9: PROC_UNAVAIL (3), PROG_MISMATCH (2) with low/high, PROG_UNAVAIL (1), GARBAGE_ARGS (4)
            send(out, call(3, 2, 100000, 2, 99), 1000);
            assertEquals(3, acceptStat(receive(in), 3));
            send(out, call(4, 2, 100000, 3, 3), 1000);
            r = receive(in);
            assertEquals(2, acceptStat(r, 4));
            assertEquals(2, r.getInt());
            assertEquals(2, r.getInt());
            send(out, call(5, 2, 100003, 2, 0), 1000);
            assertEquals(1, acceptStat(receive(in), 5));
            send(out, call(6, 2, 100000, 2, 3, 0x0607AF), 1000); // a mapping cut short
            assertEquals(4, acceptStat(receive(in), 6));
            // RFC 5531 §9: RPC version 3 is MSG_DENIED (1), RPC_MISMATCH (0), supported 2..2
            send(out, call(7, 3, 100000, 2, 0), 1000);
            r = receive(in);
            assertEquals(7, r.getInt());
            assertEquals(1, r.getInt());
            assertEquals(1, r.getInt(), "MSG_DENIED");
            assertEquals(0, r.getInt(), "RPC_MISMATCH");
            assertEquals(2, r.getInt());
            assertEquals(2, r.getInt());
        }
    }

    @Test
    void aCallInThreeByteFragmentsIsAnsweredAsAWholeRecord() throws IOException {
        try (Socket s = connect(server.corePort())) {
            DataInputStream in = new DataInputStream(s.getInputStream());
            DataOutputStream out = new DataOutputStream(s.getOutputStream());
            // VXI-11 B.6.1 create_link: clientId, lockDevice FALSE, lock_timeout, device "inst0" (padded to 8)
            byte[] link = call(10, 2, 0x0607AF, 1, 10, 42, 0, 0, 5, 0x696e7374, 0x30000000);
            send(out, link, 3);
            ByteBuffer r = receive(in);
            assertEquals(0, acceptStat(r, 10));
            assertEquals(0, r.getInt(), "no error");
            int lid = r.getInt();
            assertEquals(server.abortPort(), r.getInt());
            assertEquals(Vxi11Options.DEFAULT_MAX_RECEIVE_BYTES, r.getInt(), "maxRecvSize");
            // device_write: lid, io_timeout, lock_timeout, flags END (8), "*IDN?" (5 bytes, padded to 8)
            send(out, call(11, 2, 0x0607AF, 1, 11, lid, 1000, 1000, 8, 5, 0x2a49444e, 0x3f000000), 5);
            r = receive(in);
            assertEquals(0, acceptStat(r, 11));
            assertEquals(0, r.getInt());
            assertEquals(5, r.getInt(), "bytes taken");
            // device_read: lid, requestSize 1024, io_timeout, lock_timeout, flags 0, termChar 0
            send(out, call(12, 2, 0x0607AF, 1, 12, lid, 1024, 1000, 1000, 0, 0), 7);
            r = receive(in);
            assertEquals(0, acceptStat(r, 12));
            assertEquals(0, r.getInt(), "no error");
            assertEquals(4, r.getInt(), "reason END");
            byte[] data = new byte[r.getInt()];
            r.get(data);
            String reply = new String(data, StandardCharsets.US_ASCII);
            assertTrue(reply.startsWith("Korvane Bench Instruments,") && reply.endsWith("\n"), reply);
            // destroy_link, then the link is gone: error 4 (invalid link identifier)
            send(out, call(13, 2, 0x0607AF, 1, 23, lid), 1000);
            r = receive(in);
            assertEquals(0, acceptStat(r, 13));
            assertEquals(0, r.getInt());
            send(out, call(14, 2, 0x0607AF, 1, 23, lid), 1000);
            r = receive(in);
            assertEquals(0, acceptStat(r, 14));
            assertEquals(4, r.getInt());
        }
    }
}
