package org.zweep.runner.engine;

import java.util.List;
import org.zweep.driver.scpi.ScpiError;
import org.zweep.driver.scpi.ScpiSession;

/**
 * A {@link ScpiSession} that can carry one extra command in front of the next program message
 * instead of sending it on its own: {@code :SIM:NOIS:KEY 7} then {@code :READ?;:SYST:ERR?} go
 * as {@code :SIM:NOIS:KEY 7;:READ?;:SYST:ERR?}, one write less per point. The joined command must
 * be colon-rooted; a message that does not start with {@code :} or {@code *} gets a leading colon,
 * which at the start of a message changes nothing (SCPI-1999 Vol 1 §6.2.4: a message starts at
 * the root) and after a {@code ;} keeps its headers resolved from the root. A failed send drops
 * the joined command with the message. Thread-safe: calls are serialised.
 */
final class JoiningSession implements ScpiSession {
    private final ScpiSession inner;
    private String joined;

    JoiningSession(ScpiSession inner) {
        this.inner = inner;
    }

    /** Sends {@code command} (colon-rooted, no query) in front of the next message; replaces one not yet sent. */
    synchronized void joinNext(String command) {
        joined = command;
    }

    private String take(String message) {
        String c = joined;
        if (c == null) {
            return message;
        }
        joined = null;
        boolean rooted = message.startsWith(":") || message.startsWith("*");
        return c + ";" + (rooted ? message : ":" + message);
    }

    @Override
    public String address() {
        return inner.address();
    }

    @Override
    public synchronized void write(String message) {
        inner.write(take(message));
    }

    @Override
    public synchronized String query(String message) {
        return inner.query(take(message));
    }

    @Override
    public synchronized String query(String message, java.time.Duration expectedWork) {
        return inner.query(take(message), expectedWork);
    }

    @Override
    public synchronized byte[] queryBlock(String message) {
        return inner.queryBlock(take(message));
    }

    @Override
    public synchronized byte[] queryBlock(String message, java.time.Duration expectedWork) {
        return inner.queryBlock(take(message), expectedWork);
    }

    @Override
    public synchronized List<ScpiError> drainErrors() {
        return inner.drainErrors();
    }

    @Override
    public void close() {
        inner.close();
    }
}
