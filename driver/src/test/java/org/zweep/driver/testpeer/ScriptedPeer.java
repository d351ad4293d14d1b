package org.zweep.driver.testpeer;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Deque;
import java.util.List;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;

/**
 * The meter's side of a test conversation: reads LF-terminated commands from a stream and answers
 * each with the next scripted {@link Exchange}, in order. In echo mode it answers every command
 * with itself. Commands received are queued for {@link #takeCommand(Duration)}; a command that does
 * not match the script is recorded and reported by {@link #verify()}.
 */
public final class ScriptedPeer {

    /** What the peer expects next and how it answers. */
    public record Exchange(String command, List<Action> actions) {
    }

    private final Deque<Exchange> script = new ArrayDeque<>();
    private final boolean echo;
    private final BlockingQueue<String> received = new LinkedBlockingQueue<>();
    private final List<String> problems = new ArrayList<>();
    private final CountDownLatch closed = new CountDownLatch(1);

    private ScriptedPeer(boolean echo) {
        this.echo = echo;
    }

    /** A peer that follows a script. */
    public static ScriptedPeer scripted() {
        return new ScriptedPeer(false);
    }

    /** A peer that answers each command with the command itself and LF. */
    public static ScriptedPeer echo() {
        return new ScriptedPeer(true);
    }

    /** Expects {@code command} next and answers with {@code actions} (none for a command without reply). */
    public synchronized ScriptedPeer on(String command, Action... actions) {
        script.add(new Exchange(command, List.of(actions)));
        return this;
    }

    /** Expects {@code command} next and answers with {@code reply} in one piece. */
    public ScriptedPeer reply(String command, String reply) {
        return on(command, Action.send(reply));
    }

    /** Serves one connection until it ends or the peer is stopped; call on its own thread. */
    public void serve(InputStream in, OutputStream out) {
        ByteArrayOutputStream lineBuf = new ByteArrayOutputStream();
        try {
            int b;
            while ((b = in.read()) >= 0) {
                if (b != '\n') {
                    lineBuf.write(b);
                    continue;
                }
                String command = lineBuf.toString(StandardCharsets.ISO_8859_1);
                lineBuf.reset();
                if (command.endsWith("\r")) {
                    command = command.substring(0, command.length() - 1);
                }
                received.add(command);
                if (echo) {
                    out.write((command + "\n").getBytes(StandardCharsets.ISO_8859_1));
                    out.flush();
                    continue;
                }
                Exchange next;
                synchronized (this) {
                    next = script.poll();
                }
                if (next == null) {
                    problems.add("unexpected command '" + command + "' after the end of the script");
                    continue;
                }
                if (!next.command().equals(command)) {
                    problems.add("expected '" + next.command() + "' but got '" + command + "'");
                }
                if (!perform(next.actions(), out)) {
                    return;
                }
            }
        } catch (IOException e) {
            // the connection ended: the test decides whether that was expected
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    private boolean perform(List<Action> actions, OutputStream out) throws IOException, InterruptedException {
        for (Action a : actions) {
            if (a instanceof Action.Send s) {
                out.write(s.bytes());
                out.flush();
            } else if (a instanceof Action.Pause p) {
                if (closed.await(p.duration().toMillis(), TimeUnit.MILLISECONDS)) {
                    return false;
                }
            } else if (a instanceof Action.Stall) {
                closed.await();
                return false;
            } else if (a instanceof Action.Close) {
                out.close();
                return false;
            }
        }
        return true;
    }

    /** The next command the peer received, waiting at most {@code timeout}. */
    public String takeCommand(Duration timeout) throws InterruptedException {
        String c = received.poll(timeout.toMillis(), TimeUnit.MILLISECONDS);
        if (c == null) {
            throw new AssertionError("no command reached the peer within " + timeout);
        }
        return c;
    }

    /** Releases a stalled or pausing peer. */
    public void stop() {
        closed.countDown();
    }

    /** Fails if a command did not match the script or scripted exchanges were never asked for. */
    public synchronized void verify() {
        List<String> all = new ArrayList<>(problems);
        for (Exchange e : script) {
            all.add("scripted '" + e.command() + "' was never received");
        }
        if (!all.isEmpty()) {
            throw new AssertionError(String.join("; ", all));
        }
    }

    static byte[] bytes(String s) {
        return s.getBytes(StandardCharsets.ISO_8859_1);
    }

    /** Joins byte arrays (for block payloads in scripts). */
    public static byte[] concat(byte[]... parts) {
        byte[] out = new byte[0];
        for (byte[] p : parts) {
            int at = out.length;
            out = Arrays.copyOf(out, at + p.length);
            System.arraycopy(p, 0, out, at, p.length);
        }
        return out;
    }
}
