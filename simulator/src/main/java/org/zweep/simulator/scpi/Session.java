package org.zweep.simulator.scpi;

import java.io.ByteArrayOutputStream;
import java.util.ArrayList;
import java.util.List;

/**
 * One connection's view of the {@link Instrument}: its own parser state (the header path of
 * IEEE 488.2 Appendix A / SCPI-1999 Vol 1 §6.2.4, applied to headers as typed) and query rules;
 * the settings, status, error queue and noise keys are the instrument's and shared.
 *
 * <p>Not thread-safe: one connection thread calls {@link #execute} at a time.
 */
public final class Session {

    /** What a session needs to know about its connection's output queue. */
    public interface Hooks {
        /** Whether replies of earlier messages are still waiting to be sent (the MAV bit). */
        boolean outputPending();

        /** Discards replies of earlier messages not yet sent ({@code *CLS} after a terminator, -410). */
        void clearOutput();

        /** No output queue of its own: nothing is ever pending. */
        Hooks NONE = new Hooks() {
            @Override
            public boolean outputPending() {
                return false;
            }

            @Override
            public void clearOutput() {
            }
        };
    }

    private final Instrument instrument;
    private final CommandTree tree;
    private final Hooks hooks;
    private final List<Object> attachments = new ArrayList<>(1);
    private boolean strict;
    private boolean firstUnit;
    private List<Response> replies;

    Session(Instrument instrument, CommandTree tree, Hooks hooks, boolean strict) {
        this.instrument = instrument;
        this.tree = tree;
        this.hooks = hooks == null ? Hooks.NONE : hooks;
        this.strict = strict;
    }

    /** The instrument behind this session. */
    public Instrument instrument() {
        return instrument;
    }

    /**
     * Executes one program message (its terminator removed) and returns the response message
     * with its LF terminator, or {@code null} when the message had no query that answered.
     * May block while {@code *WAI}, {@code *OPC?}, {@code FETCh?} or {@code READ?} wait for a
     * measurement; an interrupt ends the wait and the rest of the message is skipped.
     *
     * <p>After a command error (-1xx) the rest of the message is discarded; after an execution
     * error (-2xx) the next unit runs.
     */
    public byte[] execute(byte[] message) {
        MessageParser parser = new MessageParser(message);
        List<Mnemonic> path = List.of();
        replies = new ArrayList<>(2);
        firstUnit = true;
        try {
            while (parser.hasNext()) {
                ProgramUnit unit = parser.next();
                if (unit == null) {
                    break;
                }
                Handler h;
                String headerText;
                if (unit.common()) {
                    h = tree.common(unit.header().get(0), unit.query());
                    headerText = "*" + unit.header().get(0).name();
                } else {
                    List<Mnemonic> full = unit.rooted() ? unit.header() : concat(path, unit.header());
                    path = full.subList(0, full.size() - 1);
                    headerText = CommandTree.describe(full, unit.query());
                    h = tree.resolve(full, unit.query());
                }
                try {
                    Response r = h.handle(new Call(this, unit.params(), headerText));
                    if (r != null) {
                        replies.add(r);
                    }
                } catch (ScpiException e) {
                    instrument.status().report(e);
                    if (e.error().code() <= -100 && e.error().code() > -200) {
                        break;
                    }
                } catch (RuntimeException e) {
                    // a handler's own bug: one error in the queue, never a stack trace
                    report(StandardError.DEVICE_SPECIFIC_ERROR, headerText + ": " + e);
                }
                firstUnit = false;
                if (Thread.currentThread().isInterrupted()) {
                    break;
                }
            }
        } catch (ScpiException e) {
            instrument.status().report(e);
        }
        List<Response> out = replies;
        replies = null;
        if (out.isEmpty()) {
            return null;
        }
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        for (int i = 0; i < out.size(); i++) {
            if (i > 0) {
                b.write(';');
            }
            b.writeBytes(out.get(i).bytes());
        }
        b.write('\n');
        return b.toByteArray();
    }

    /** Reports an error that the connection found (e.g. -363 input buffer overrun, -410). */
    public void report(StandardError error, String info) {
        instrument.status().report(new ScpiException(error, info));
    }

    /** Reports any error number, e.g. one pushed by fault injection. */
    public void report(int code, String text) {
        instrument.status().report(code, text);
    }

    /** Whether this connection follows the strict IEEE 488.2 §6.3.2 query rules (-410, -420). */
    public boolean strict() {
        return strict;
    }

    void setStrict(boolean s) {
        strict = s;
    }

    /** Attaches a connection-side object that server-contributed handlers look up by type. */
    public void attach(Object o) {
        attachments.add(o);
    }

    /** The attached object of {@code type}, or {@code null}. */
    public <T> T attachment(Class<T> type) {
        for (Object o : attachments) {
            if (type.isInstance(o)) {
                return type.cast(o);
            }
        }
        return null;
    }

    /** Every header the command tree declares. */
    java.util.List<String> headers() {
        return tree.headers();
    }

    /** MAV: a reply of an earlier message is pending, or an earlier unit of this one answered. */
    boolean messageAvailable() {
        return hooks.outputPending() || (replies != null && !replies.isEmpty());
    }

    /** {@code *CLS}: also clears the output queue when it directly follows a terminator (§10.3). */
    void clearStatus() {
        instrument.clearStatus();
        if (firstUnit) {
            hooks.clearOutput();
        }
    }

    private static List<Mnemonic> concat(List<Mnemonic> a, List<Mnemonic> b) {
        if (a.isEmpty()) {
            return b;
        }
        List<Mnemonic> out = new ArrayList<>(a.size() + b.size());
        out.addAll(a);
        out.addAll(b);
        return out;
    }
}
