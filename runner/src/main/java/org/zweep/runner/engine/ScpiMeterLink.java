package org.zweep.runner.engine;

import java.util.Optional;
import java.util.function.Function;
import java.util.function.Supplier;
import org.zweep.driver.MeterException;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.dialect.DialectMeter;
import org.zweep.driver.meter.FixtureControl;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.MeterIdentity;
import org.zweep.driver.scpi.ScpiProtocolException;
import org.zweep.driver.scpi.ScpiSession;
import org.zweep.driver.transport.ConnectFailedException;
import org.zweep.driver.transport.ConnectionLostException;
import org.zweep.driver.transport.MeterTimeoutException;
import org.zweep.driver.uncertainty.MeterAccuracy;

/**
 * A {@link MeterLink} over SCPI: a {@link DialectMeter} on a session from {@code connector},
 * re-opened through the same connector.
 */
public final class ScpiMeterLink implements MeterLink {
    /**
     * What whoever opens the link knows of the meter beyond its dialect.
     *
     * @param timed whether the meter takes real time (see {@link MeterLink#timed()})
     * @param fixture the fixture the meter switches on a session when its dialect declares none, or
     *     null
     */
    public record LinkOptions(boolean timed, Function<ScpiSession, FixtureControl> fixture) {
        /** A meter on a real link: timed, its fixture as its dialect declares. */
        public static final LinkOptions REAL = new LinkOptions(true, null);
    }

    private final String address;
    private final Dialect dialect;
    private final Supplier<ScpiSession> connector;
    private final Runnable onClose;
    private final LinkOptions options;
    private volatile ScpiSession session;
    private volatile DialectMeter meter;

    private ScpiMeterLink(String address, Dialect dialect, Supplier<ScpiSession> connector, Runnable onClose,
            LinkOptions options) {
        this.address = address;
        this.dialect = dialect;
        this.connector = connector;
        this.onClose = onClose;
        this.options = options;
    }

    /**
     * Connects and identifies the meter.
     *
     * @param address the address (for messages)
     * @param dialect the meter's dialect (loaded once by the caller)
     * @param connector opens a new session each call (blocking up to its connect timeout)
     * @param onClose run after the link is closed (e.g. stops a meter started for the link)
     * @throws MeterException when the meter cannot be reached
     */
    public static ScpiMeterLink open(String address, Dialect dialect, Supplier<ScpiSession> connector,
            Runnable onClose) {
        return open(address, dialect, connector, onClose, LinkOptions.REAL);
    }

    /** As {@link #open(String, Dialect, Supplier, Runnable)}, with what is known of the meter beyond its dialect. */
    public static ScpiMeterLink open(String address, Dialect dialect, Supplier<ScpiSession> connector,
            Runnable onClose, LinkOptions options) {
        ScpiMeterLink link = new ScpiMeterLink(address, dialect, connector, onClose, options);
        // a link that breaks while the meter is being identified is opened again, as a reconnect
        // would be; a meter that cannot be reached at all fails at once
        for (int attempt = 1;; attempt++) {
            try {
                link.connect();
                return link;
            } catch (MeterException e) {
                if (e instanceof ConnectFailedException || !link.isLinkFailure(e) || attempt >= FIRST_CONNECT_ATTEMPTS) {
                    throw e;
                }
            }
            try {
                Thread.sleep(100L << attempt);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new MeterException(address + ": interrupted while connecting");
            }
        }
    }

    /** How often the first connection is tried when it breaks while identifying the meter. */
    private static final int FIRST_CONNECT_ATTEMPTS = 5;

    @Override
    public Optional<MeterAccuracy> accuracy() {
        return dialect.accuracy();
    }

    private Meter connect() {
        ScpiSession s = connector.get();
        try {
            DialectMeter m = new DialectMeter(s, dialect);
            agreedIdentity(m);
            session = s;
            meter = m;
            return m;
        } catch (RuntimeException e) {
            s.close();
            throw e;
        }
    }

    /**
     * The identity read until two reads agree (at most four): a reply corrupted on the way must not
     * make one meter look like another.
     */
    private MeterIdentity agreedIdentity(DialectMeter m) {
        java.util.List<MeterIdentity> seen = new java.util.ArrayList<>();
        for (int i = 0; i < 4; i++) {
            MeterIdentity id = m.identify();
            if (seen.contains(id)) {
                return id;
            }
            seen.add(id);
        }
        throw new ScpiProtocolException(address + ": the meter gave " + seen.size()
                + " different identities (replies corrupted on the way)");
    }

    @Override
    public String address() {
        return address;
    }

    @Override
    public Meter meter() {
        return meter;
    }

    /** The current SCPI session (for tests and diagnostics). */
    public ScpiSession session() {
        return session;
    }

    @Override
    public Meter reconnect() {
        ScpiSession old = session;
        if (old != null) {
            old.close();
        }
        return connect();
    }

    @Override
    public boolean isLinkFailure(MeterException e) {
        return e instanceof ConnectionLostException || e instanceof MeterTimeoutException
                || e instanceof ConnectFailedException || e instanceof ScpiProtocolException;
    }

    @Override
    public Optional<FixtureControl> fixtureControl() {
        Optional<FixtureControl> own = meter.fixture();
        if (own.isPresent() || options.fixture() == null) {
            return own;
        }
        return Optional.of(options.fixture().apply(session));
    }

    @Override
    public boolean timed() {
        return options.timed();
    }

    @Override
    public void close() {
        try {
            DialectMeter m = meter;
            if (m != null) {
                m.safeShutdown();
            }
        } finally {
            onClose.run();
        }
    }
}
