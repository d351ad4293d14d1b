package org.zweep.simulator.server;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.net.InetSocketAddress;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.zweep.simulator.scpi.Instrument;

/**
 * The attackers of {@link ServerSoakIT}, run in a process of their own as real attackers are: the
 * attacks that grew the server (issue 17), each bounded and closed at the end. Arguments: host,
 * port, the server's connection cap, rounds per batch, the gap between idle connections opened
 * (microseconds, 0 for all at once). Protocol on stdout/stdin: {@code phase NAME} when an attack
 * starts; {@code closed? N} after closing many connections at once (N: the connections opened so
 * far), answered by a line on stdin once the server has taken all N from its backlog and seen them
 * close (the next attacks need free slots); {@code warm} after the first
 * round (the warm-up), answered by a line on stdin to go on; {@code done} after each batch of
 * rounds, answered by {@code again} for another batch or anything else to end. A wrong answer
 * ends the process with exit 1 and one line on stderr.
 */
final class SoakAttacks {
    private final InetSocketAddress server;
    private final int cap;
    private final BufferedReader parent = new BufferedReader(new InputStreamReader(System.in, StandardCharsets.US_ASCII));

    private final long idleGapNanos;
    /** Connections opened so far. */
    private long opened;

    private SoakAttacks(InetSocketAddress server, int cap, long idleGapMicros) {
        this.server = server;
        this.cap = cap;
        this.idleGapNanos = idleGapMicros * 1000;
    }

    public static void main(String[] args) throws Exception {
        SoakAttacks a = new SoakAttacks(new InetSocketAddress(args[0], Integer.parseInt(args[1])), Integer.parseInt(args[2]),
                Long.parseLong(args[4]));
        int rounds = Integer.parseInt(args[3]);
        try {
            a.round();
            a.say("warm");
            a.parent.readLine();
            do {
                for (int r = 0; r < rounds; r++) {
                    a.round();
                }
                a.say("done"); // the parent reads this process's CPU time, then says again or bye
            } while ("again".equals(a.parent.readLine()));
        } catch (Exception | AssertionError e) {
            System.err.println("soak attacker: " + e);
            System.exit(1);
        }
    }

    private void say(String line) {
        System.out.println(line);
        System.out.flush();
    }

    private void phase(String name) {
        say("phase " + name);
    }

    private void awaitClosed() throws IOException {
        say("closed? " + opened);
        parent.readLine();
    }

    private static void expect(String expected, String actual, String where) {
        if (!expected.equals(actual)) {
            throw new AssertionError(where + ": expected <" + expected + "> but was <" + actual + ">");
        }
    }

    private RawClient client() throws IOException {
        opened++;
        return new RawClient(server);
    }

    /** One of each attack, each bounded, each closed at the end. */
    private void round() throws IOException {
        String idn = Instrument.IDENTIFICATION;
        phase("delayed flood");
        // unread delayed replies: the queue fills to its bound, then -430
        try (RawClient c = client()) {
            c.send("SIM:FAUL:DEL 3600,100000000");
            c.sendRaw(repeated("*IDN?", 10_000));
            c.send("*OPC?");
        }
        phase("non-readers");
        // twenty clients that never read
        closeAll(sendingEach(20, repeated("*IDN?", 3000)));
        awaitClosed();
        phase("idle");
        // idle connections up to a few below the cap (the probe needs a free slot)
        List<RawClient> idle = new ArrayList<>();
        for (int i = 0; i < cap - 4; i++) {
            long next = System.nanoTime() + idleGapNanos;
            idle.add(client());
            for (long left = next - System.nanoTime(); left > 0; left = next - System.nanoTime()) {
                java.util.concurrent.locks.LockSupport.parkNanos(left);
            }
        }
        closeAll(idle);
        awaitClosed();
        phase("long line");
        // a line longer than the message limit without LF, then one with; the connection goes on
        // (the errors themselves are checked in ServerIT and ServerLimitsIT: the error queue is the
        // meter's, shared with the attacks still draining, so here only that the connection goes on)
        try (RawClient c = client()) {
            byte[] a = new byte[2 << 20];
            Arrays.fill(a, (byte) 'A');
            c.sendRaw(a);
            c.send("");
            expect(idn, c.query("*IDN?"), "after a long line");
        }
        phase("netlist");
        // a netlist far over the element limit
        try (RawClient c = client()) {
            StringBuilder n = new StringBuilder();
            for (int i = 1; i <= 12_000; i++) {
                n.append('R').append(i).append(" a").append(i).append(" b").append(i).append(" 1\\n");
            }
            c.send("SIM:DEV \"" + n + "\"");
            expect(idn, c.query("*IDN?"), "after a huge netlist");
        }
        phase("odd syntax");
        // odd syntax: a lone '#', a block whose length never comes, a bad idle time, an unknown header
        try (RawClient c = client()) {
            c.sendRaw("SOUR:FREQ #\n*IDN?\n".getBytes(StandardCharsets.US_ASCII));
            expect(idn, c.readLine(), "after a lone '#'"); // the LF after '#' ended the first message
            c.send("SIM:FAUL:DROP:IDLE 1E-10");
            c.send("NO:SUCH:HEADer 1;*CLS");
            c.send("SIM:DEV #9000000100R1 hi lo 1");
        }
        phase("half-open");
        // half-open: a partial message, then the client vanishes
        closeAll(sendingEach(20, "SOUR:FREQ 1".getBytes(StandardCharsets.US_ASCII)));
        awaitClosed();
    }

    static byte[] repeated(String message, int times) {
        return (message + "\n").repeat(times).getBytes(StandardCharsets.US_ASCII);
    }

    /** {@code n} new clients, each having sent {@code bytes} (and read nothing). */
    private List<RawClient> sendingEach(int n, byte[] bytes) throws IOException {
        List<RawClient> clients = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            RawClient c = client();
            clients.add(c);
            c.sendRaw(bytes);
        }
        return clients;
    }

    private static void closeAll(List<RawClient> clients) throws IOException {
        for (RawClient c : clients) {
            c.close();
        }
    }
}
