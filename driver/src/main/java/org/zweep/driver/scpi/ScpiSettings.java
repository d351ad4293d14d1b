package org.zweep.driver.scpi;

import java.nio.file.Path;
import java.time.Duration;
import java.util.Objects;
import org.zweep.driver.transport.TransportOptions;

/**
 * How a {@link ScpiClient} talks: timeouts, terminators, limits, resynchronisation and tracing.
 * Build with {@link #builder()}; {@link #DEFAULTS} lists the defaults.
 *
 * @param connectTimeout longest wait to open the link (default 5 s); never infinite
 * @param readTimeout longest wait for a reply to start, and for each pause within it (default 5 s)
 * @param writeTimeout longest wait for a serial port to take a message (default 5 s)
 * @param writeTerminator appended to every program message (default LF, {@code "\n"})
 * @param readTerminator ends every response message (default LF); when it is LF, a CR just before
 *     it is dropped too, so CR LF replies read the same
 * @param maxResponseBytes the longest reply accepted, blocks included (default 16 MiB); a longer one
 *     is a {@link ScpiProtocolException}, never an out-of-memory
 * @param clearOnConnect send {@code *CLS} when connecting (default true)
 * @param resync how to get back in step after a timeout (default {@link Resync#OPC})
 * @param drainQuiet how long the link must stay silent to count as drained (default 50 ms)
 * @param errorQuery the query that reads one error-queue entry (default {@code SYST:ERR?})
 * @param tracePath file the traffic is appended to, or {@code null} for no trace (default)
 */
public record ScpiSettings(
        Duration connectTimeout,
        Duration readTimeout,
        Duration writeTimeout,
        String writeTerminator,
        String readTerminator,
        int maxResponseBytes,
        boolean clearOnConnect,
        Resync resync,
        Duration drainQuiet,
        String errorQuery,
        Path tracePath) {

    /** The defaults, as listed on the record components. */
    public static final ScpiSettings DEFAULTS = new ScpiSettings(Duration.ofSeconds(5), Duration.ofSeconds(5),
            Duration.ofSeconds(5), "\n", "\n", 16 * 1024 * 1024, true, Resync.OPC, Duration.ofMillis(50),
            "SYST:ERR?", null);

    /** Checks every value: positive timeouts, non-empty terminators, a positive size limit. */
    public ScpiSettings {
        positive(connectTimeout, "connectTimeout");
        positive(readTimeout, "readTimeout");
        positive(writeTimeout, "writeTimeout");
        positive(drainQuiet, "drainQuiet");
        if (writeTerminator == null || writeTerminator.isEmpty() || readTerminator == null
                || readTerminator.isEmpty()) {
            throw new IllegalArgumentException("terminators must not be empty");
        }
        if (maxResponseBytes < 1) {
            throw new IllegalArgumentException("maxResponseBytes must be positive: " + maxResponseBytes);
        }
        Objects.requireNonNull(resync, "resync");
        Objects.requireNonNull(errorQuery, "errorQuery");
    }

    private static void positive(Duration d, String name) {
        Objects.requireNonNull(d, name);
        if (d.isNegative() || d.isZero()) {
            throw new IllegalArgumentException(name + " must be positive: " + d);
        }
    }

    /** A builder starting from {@link #DEFAULTS}. */
    public static Builder builder() {
        return new Builder(DEFAULTS);
    }

    /** A builder starting from these settings. */
    public Builder toBuilder() {
        return new Builder(this);
    }

    /** The options the transport is opened with. */
    public TransportOptions transportOptions() {
        return new TransportOptions(connectTimeout, writeTimeout);
    }

    /** Builds {@link ScpiSettings}; not thread-safe. */
    public static final class Builder {
        private Duration connectTimeout;
        private Duration readTimeout;
        private Duration writeTimeout;
        private String writeTerminator;
        private String readTerminator;
        private int maxResponseBytes;
        private boolean clearOnConnect;
        private Resync resync;
        private Duration drainQuiet;
        private String errorQuery;
        private Path tracePath;

        private Builder(ScpiSettings s) {
            connectTimeout = s.connectTimeout;
            readTimeout = s.readTimeout;
            writeTimeout = s.writeTimeout;
            writeTerminator = s.writeTerminator;
            readTerminator = s.readTerminator;
            maxResponseBytes = s.maxResponseBytes;
            clearOnConnect = s.clearOnConnect;
            resync = s.resync;
            drainQuiet = s.drainQuiet;
            errorQuery = s.errorQuery;
            tracePath = s.tracePath;
        }

        /** @see ScpiSettings#connectTimeout() */
        public Builder connectTimeout(Duration d) {
            connectTimeout = d;
            return this;
        }

        /** @see ScpiSettings#readTimeout() */
        public Builder readTimeout(Duration d) {
            readTimeout = d;
            return this;
        }

        /** @see ScpiSettings#writeTimeout() */
        public Builder writeTimeout(Duration d) {
            writeTimeout = d;
            return this;
        }

        /** @see ScpiSettings#writeTerminator() */
        public Builder writeTerminator(String t) {
            writeTerminator = t;
            return this;
        }

        /** @see ScpiSettings#readTerminator() */
        public Builder readTerminator(String t) {
            readTerminator = t;
            return this;
        }

        /** @see ScpiSettings#maxResponseBytes() */
        public Builder maxResponseBytes(int n) {
            maxResponseBytes = n;
            return this;
        }

        /** @see ScpiSettings#clearOnConnect() */
        public Builder clearOnConnect(boolean b) {
            clearOnConnect = b;
            return this;
        }

        /** @see ScpiSettings#resync() */
        public Builder resync(Resync r) {
            resync = r;
            return this;
        }

        /** @see ScpiSettings#drainQuiet() */
        public Builder drainQuiet(Duration d) {
            drainQuiet = d;
            return this;
        }

        /** @see ScpiSettings#errorQuery() */
        public Builder errorQuery(String q) {
            errorQuery = q;
            return this;
        }

        /** @see ScpiSettings#tracePath() */
        public Builder tracePath(Path p) {
            tracePath = p;
            return this;
        }

        /** The settings; checks every value. */
        public ScpiSettings build() {
            return new ScpiSettings(connectTimeout, readTimeout, writeTimeout, writeTerminator, readTerminator,
                    maxResponseBytes, clearOnConnect, resync, drainQuiet, errorQuery, tracePath);
        }
    }
}
