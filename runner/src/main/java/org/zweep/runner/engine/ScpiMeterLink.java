package org.zweep.runner.engine;

import java.util.Optional;
import java.util.function.Supplier;
import org.zweep.driver.MeterException;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.dialect.DialectMeter;
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
 * re-opened through the same connector. The zweep simulator is recognised by its {@code *IDN?}
 * identity, wherever it runs (in-process or over TCP), and then offers its
 * {@link SimulatorControl}.
 */
public final class ScpiMeterLink implements MeterLink {
    private final String address;
    private final Dialect dialect;
    private final Supplier<ScpiSession> connector;
    private final Runnable onClose;
    private volatile ScpiSession session;
    private volatile DialectMeter meter;
    private volatile ScpiSimulatorControl simulator;

    private ScpiMeterLink(String address, Dialect dialect, Supplier<ScpiSession> connector, Runnable onClose) {
        this.address = address;
        this.dialect = dialect;
        this.connector = connector;
        this.onClose = onClose;
    }

    /**
     * Connects and identifies the meter.
     *
     * @param address the address (for messages)
     * @param dialect a dialect name or file
     * @param connector opens a new session each call (blocking up to its connect timeout)
     * @param onClose run after the link is closed (e.g. stops an in-process simulator)
     * @throws MeterException when the meter cannot be reached
     */
    public static ScpiMeterLink open(String address, String dialect, Supplier<ScpiSession> connector,
            Runnable onClose) {
        ScpiMeterLink link = new ScpiMeterLink(address, Dialect.load(dialect), connector, onClose);
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
        JoiningSession s = new JoiningSession(connector.get());
        try {
            DialectMeter m = new DialectMeter(s, dialect);
            MeterIdentity id = agreedIdentity(m);
            session = s;
            meter = m;
            simulator = ScpiSimulatorControl.isSimulator(id) ? new ScpiSimulatorControl(s) : null;
            return m;
        } catch (RuntimeException e) {
            s.close();
            throw e;
        }
    }

    /**
     * The identity read until two reads agree (at most four): a reply corrupted on the way must not
     * make the simulator look like a real meter, or a real meter like another.
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
    public Optional<org.zweep.driver.meter.FixtureControl> fixtureControl() {
        Optional<org.zweep.driver.meter.FixtureControl> own = meter.fixture();
        if (own.isPresent() || simulator == null) {
            return own;
        }
        return Optional.of(simulator.fixture());
    }

    @Override
    public Optional<SimulatorControl> simulator() {
        return Optional.ofNullable(simulator);
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
