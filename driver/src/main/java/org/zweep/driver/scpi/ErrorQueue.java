package org.zweep.driver.scpi;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Collectors;

/**
 * A meter's error queue read through any error query ({@code :SYST:ERR?}, or a maker's own word):
 * replies {@code code,"text"}, code 0 when empty (SCPI-1999 Vol 2 §21.8). Replies are checked
 * strictly, so that a reply corrupted on the way is reported as such and never taken for an
 * error or for an empty queue. Stateless and thread-safe.
 */
public final class ErrorQueue {
    /** The most entries read in one go; a queue that never empties is a fault of its own. */
    public static final int MAX_ENTRIES = 64;
    /** The empty error queue's answer (SCPI-1999 Vol 2 §21.8). */
    private static final String NO_ERROR = "0,\"No error\"";

    private ErrorQueue() {
    }

    /**
     * Asks {@code query} until the meter answers code 0 and returns the entries read, oldest
     * first, after {@code earlier}. The first answer is awaited after {@code firstWork} of the
     * meter's (see {@link ScpiSession#query(String, Duration)}).
     *
     * @param what what was being done, for messages ("applying 1000 Hz")
     * @throws ScpiProtocolException when a reply is not an error entry, or the queue does not empty
     */
    public static List<ScpiError> read(ScpiSession session, String query, Duration firstWork, List<ScpiError> earlier,
            String what) {
        List<ScpiError> errors = new ArrayList<>(earlier);
        for (int i = 0; i < MAX_ENTRIES; i++) {
            ScpiError e = parse(session.address(), session.query(query, i == 0 ? firstWork : Duration.ZERO), what);
            if (e.code() == 0) {
                return errors;
            }
            errors.add(e);
        }
        throw new ScpiProtocolException(session.address() + ": the error queue was not empty after " + MAX_ENTRIES
                + " reads of '" + query + "' while " + what);
    }

    /**
     * {@link #read} that throws when the queue held anything.
     *
     * @throws MeterErrorException carrying every entry, oldest first
     */
    public static void check(ScpiSession session, String query, Duration firstWork, String what) {
        List<ScpiError> errors = read(session, query, firstWork, List.of(), what);
        if (!errors.isEmpty()) {
            throw failure(session.address(), errors, what);
        }
    }

    /** The exception for a queue that held {@code errors}: one line with every entry. */
    public static MeterErrorException failure(String address, List<ScpiError> errors, String what) {
        return new MeterErrorException(address + ": the meter reported "
                + errors.stream().map(ScpiError::toString).collect(Collectors.joining("; ")) + " while " + what,
                errors);
    }

    /**
     * Parses one reply {@code code,"text"}; the text may be missing, and is unquoted (a doubled
     * quote is one quote, IEEE 488.2 §7.7.5).
     *
     * @param address the meter's address, for messages
     * @param what what was being done, for messages
     * @throws ScpiProtocolException when the reply is not an error entry, or is one corrupted on the way
     */
    public static ScpiError parse(String address, String reply, String what) {
        String r = reply.strip();
        int comma = r.indexOf(',');
        String code = comma < 0 ? r : r.substring(0, comma).strip();
        int n;
        try {
            n = Integer.parseInt(code.startsWith("+") ? code.substring(1) : code);
        } catch (NumberFormatException e) {
            throw bad(address, reply, "is not 'code,\"text\"'", what);
        }
        String text = comma < 0 ? "" : r.substring(comma + 1).strip();
        boolean quoted = text.length() >= 2 && text.startsWith("\"") && text.endsWith("\"");
        if (n != 0 && !text.isEmpty() && !quoted) {
            throw bad(address, reply, "is not 'code,\"text\"' (corrupted on the way)", what);
        }
        if (quoted) {
            String inner = text.substring(1, text.length() - 1);
            if (n != 0 && inner.replace("\"\"", "").contains("\"")) {
                // IEEE 488.2 §7.7.5: a quote inside a string is doubled; a lone one means the
                // reply was corrupted on the way (a lost separator joined two replies)
                throw bad(address, reply, "is not 'code,\"text\"' (corrupted on the way)", what);
            }
            text = inner.replace("\"\"", "\"");
        }
        if (n != 0 && nearNoError(r)) {
            // SCPI-1999 Vol 2 §21.8: 0,"No error" is the empty queue's answer; a reply of its length
            // that differs from it in a few characters is that answer corrupted on the way
            throw bad(address, reply, "is 0,\"No error\" with characters replaced (corrupted on the way)", what);
        }
        return new ScpiError(n, text);
    }

    /** Whether {@code reply} is {@code 0,"No error"} with at most a third of its characters replaced. */
    static boolean nearNoError(String reply) {
        if (reply.length() != NO_ERROR.length()) {
            return false;
        }
        int differ = 0;
        for (int i = 0; i < reply.length(); i++) {
            if (Character.toLowerCase(reply.charAt(i)) != Character.toLowerCase(NO_ERROR.charAt(i))) {
                differ++;
            }
        }
        return differ * 3 <= NO_ERROR.length();
    }

    private static ScpiProtocolException bad(String address, String reply, String why, String what) {
        return new ScpiProtocolException(address + ": reply '" + ScpiValues.abbreviate(reply) + "' to the error query "
                + why + " while " + what);
    }
}
