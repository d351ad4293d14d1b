package org.zweep.driver.transport.vxi11;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.function.BiFunction;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.Vxi11Address;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.TransportOptions;

/**
 * The VXI-11 client against a scripted ONC RPC server whose replies are written byte by byte here
 * (RFC 5531 §9 reply header, RFC 4506 XDR): an RPC that is answered late (after the client gave up)
 * and a record far larger than the client asked for.
 */
class Vxi11HostileServerIT {
    private ServerSocket listener;
    private final List<Socket> sockets = new ArrayList<>();

    @AfterEach
    void stop() throws IOException {
        for (Socket s : sockets) {
            s.close();
        }
        if (listener != null) {
            listener.close();
        }
    }

    /** One call as the server sees it: transaction id, procedure and the argument words. */
    record Call(int xid, int procedure, ByteBuffer args) {
    }

    /**
     * A server on one port for the portmapper and the core channel: GETPORT answers that same port,
     * create_link answers link 7 (no abort channel, maxRecvSize 1024), and every other call goes
     * to {@code core}, which writes its own replies (or none) to the stream.
     */
    private Vxi11Address start(BiFunction<Call, DataOutputStream, Boolean> core) throws IOException {
        listener = new ServerSocket(0, 50, InetAddress.getLoopbackAddress());
        int port = listener.getLocalPort();
        Thread t = new Thread(() -> {
            while (!listener.isClosed()) {
                try {
                    Socket s = listener.accept();
                    sockets.add(s);
                    Thread c = new Thread(() -> serve(s, port, core));
                    c.setDaemon(true);
                    c.start();
                } catch (IOException e) {
                    return;
                }
            }
        });
        t.setDaemon(true);
        t.start();
        return (Vxi11Address) Address.parse("vxi11://127.0.0.1:" + port + "/inst0");
    }

    private static void serve(Socket s, int port, BiFunction<Call, DataOutputStream, Boolean> core) {
        try (s) {
            DataInputStream in = new DataInputStream(s.getInputStream());
            DataOutputStream out = new DataOutputStream(s.getOutputStream());
            while (true) {
                int mark = in.readInt(); // one fragment per call, as the client sends them
                byte[] record = new byte[mark & 0x7fffffff];
                in.readFully(record);
                ByteBuffer b = ByteBuffer.wrap(record);
                int xid = b.getInt();
                b.getInt(); // CALL
                b.getInt(); // RPC version 2
                int program = b.getInt();
                b.getInt(); // version
                int procedure = b.getInt();
                b.position(b.position() + 16); // AUTH_NONE credentials and verifier, empty bodies
                if (program == 100000) {
                    reply(out, xid, port);
                } else if (procedure == 10) {
                    reply(out, xid, 0, 7, 0, 1024);
                } else if (!core.apply(new Call(xid, procedure, b.slice()), out)) {
                    return;
                }
            }
        } catch (IOException e) {
            // the client went away
        }
    }

    /** An accepted, successful reply (RFC 5531 §9) with the given result words, in one fragment. */
    static void reply(DataOutputStream out, int xid, int... words) {
        try {
            out.writeInt(0x80000000 | (24 + 4 * words.length));
            out.writeInt(xid);
            out.writeInt(1); // REPLY
            out.writeInt(0); // MSG_ACCEPTED
            out.writeInt(0); // verifier AUTH_NONE
            out.writeInt(0); // with an empty body
            out.writeInt(0); // SUCCESS
            for (int w : words) {
                out.writeInt(w);
            }
            out.flush();
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    /** A device_read reply: error 0, reason END, the text as opaque data (padded to 4 bytes). */
    static int[] readReply(String text) {
        byte[] b = text.getBytes(StandardCharsets.US_ASCII);
        int[] words = new int[3 + (b.length + 3) / 4];
        words[1] = 4; // END
        words[2] = b.length;
        for (int i = 0; i < b.length; i++) {
            words[3 + i / 4] |= (b[i] & 0xff) << (24 - 8 * (i % 4));
        }
        return words;
    }

    @Test
    void aReadTheServerAnswersTooLateIsATimeoutAndItsLateReplyIsNeverTakenForTheNext() throws IOException {
        List<Integer> reads = new ArrayList<>();
        Vxi11Address a = start((call, out) -> {
            if (call.procedure() == 12) {
                reads.add(call.xid());
                if (reads.size() == 2) { // answer the first read only now, then the second
                    reply(out, reads.get(0), readReply("stale\n"));
                    reply(out, reads.get(1), readReply("fresh\n"));
                }
            } else {
                reply(out, call.xid(), 0, 0);
            }
            return true;
        });
        try (Vxi11Transport t = Vxi11Transport.connect(a, TransportOptions.DEFAULT)) {
            byte[] buf = new byte[64];
            long t0 = System.nanoTime();
            assertEquals(0, t.read(buf, 0, buf.length, 200), "no RPC reply within the timeout and the grace");
            long ms = (System.nanoTime() - t0) / 1_000_000;
            assertTrue(ms >= 200 + Vxi11Transport.RPC_GRACE_MILLIS - 50, "gave up after " + ms + " ms");
            int n = t.read(buf, 0, buf.length, 2000);
            assertEquals("fresh\n", new String(buf, 0, n, StandardCharsets.US_ASCII));
        }
    }

    @Test
    void aRecordFarLargerThanAskedForIsRefusedAndTheLinkIsLost() throws IOException {
        Vxi11Address a = start((call, out) -> {
            try {
                out.writeInt(0x80000000 | (64 << 20)); // announces 64 MiB; the client asked for 16 bytes
                out.writeInt(call.xid());
                out.flush();
            } catch (IOException e) {
                return false;
            }
            return true;
        });
        try (Vxi11Transport t = Vxi11Transport.connect(a, TransportOptions.DEFAULT, 16)) {
            ConnectionLostException e = assertThrows(ConnectionLostException.class,
                    () -> t.read(new byte[64], 0, 64, 1000));
            assertTrue(e.getMessage().contains("an RPC record longer than 80 bytes"), e.getMessage());
            assertThrows(ConnectionLostException.class, () -> t.read(new byte[64], 0, 64, 1000));
        }
    }
}
