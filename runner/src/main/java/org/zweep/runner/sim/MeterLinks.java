package org.zweep.runner.sim;

import java.util.Locale;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.SimAddress;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSession;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.engine.ScpiMeterLink;

/**
 * Opens a meter link for any address the driver accepts, {@code sim:} included. A {@code sim:}
 * address is the zweep simulator, and the link says what its bench says: whether it takes real
 * time, and its fixture (switched by its own commands when the dialect declares none). Two forms:
 * <ul>
 *   <li>{@code sim:BENCH_FILE[?timing=real|none][&seed=N]}: one simulator started in this process;</li>
 *   <li>{@code sim:tcp://HOST:PORT[?seed=N]}: a simulator already serving over TCP ({@code zweep sim}),
 *       its timing asked of it, its seed set when given.</li>
 * </ul>
 */
public final class MeterLinks {
    /** The prefix of a simulator served over TCP. */
    private static final String REMOTE = "tcp://";

    private MeterLinks() {
    }

    /**
     * Connects to the meter at {@code address} speaking {@code dialect}. For an in-process
     * {@code sim:} address one simulator is started and every reconnect reaches that same meter;
     * closing the link stops it.
     *
     * @throws org.zweep.driver.InvalidInputException when the address or dialect is malformed
     * @throws org.zweep.driver.MeterException when the meter cannot be reached
     */
    public static ScpiMeterLink open(String address, String dialectName, ScpiSettings settings) {
        Address a = Address.parse(address);
        Dialect dialect = Dialect.load(dialectName);
        if (a instanceof SimAddress sim && sim.bench().startsWith(REMOTE)) {
            return remote(address, sim.bench(), dialect, settings);
        }
        if (a instanceof SimAddress) {
            InProcessSimulator sim = InProcessSimulator.start(address);
            try {
                return ScpiMeterLink.open(address, dialect, () -> sim.connect(settings), sim::close,
                        new ScpiMeterLink.LinkOptions(sim.timed(), SimulatorFixture::new));
            } catch (RuntimeException e) {
                sim.close();
                throw e;
            }
        }
        // a meter outside IEEE 488.2 is sent nothing its dialect does not declare: no *CLS on connecting
        ScpiSettings s = dialect.takesCommonCommands() ? settings
                : settings.toBuilder().clearOnConnect(false).build();
        return ScpiMeterLink.open(address, dialect, () -> ScpiClient.open(a, s), () -> { });
    }

    private static ScpiMeterLink remote(String address, String rest, Dialect dialect, ScpiSettings settings) {
        int q = rest.indexOf('?');
        Address tcp = Address.parse(q >= 0 ? rest.substring(0, q) : rest);
        Long seed = null;
        if (q >= 0) {
            for (String kv : rest.substring(q + 1).split("&")) {
                String[] p = kv.split("=", 2);
                if (p.length == 2 && p[0].equals("seed")) {
                    seed = InProcessSimulator.seed(address, p[1]);
                } else {
                    throw new InvalidInputException("address '" + address + "': unknown option '" + kv
                            + "' (sim:tcp://HOST:PORT[?seed=N])");
                }
            }
        }
        boolean timed;
        try (ScpiSession s = ScpiClient.open(tcp, settings)) {
            timed = s.query(":SIM:TIM?").strip().toUpperCase(Locale.ROOT).startsWith("REAL");
            if (seed != null) {
                s.query(":SIM:SEED " + seed + ";*OPC?");
            }
        }
        return ScpiMeterLink.open(address, dialect, () -> ScpiClient.open(tcp, settings), () -> { },
                new ScpiMeterLink.LinkOptions(timed, SimulatorFixture::new));
    }

    /**
     * {@code address} with its bench's noise seed set to {@code seed} ({@code null}: as it is).
     *
     * @throws InvalidInputException when {@code seed} is given for a meter that is not the simulator
     */
    public static String seeded(String address, Long seed) {
        if (seed == null) {
            return address;
        }
        if (!(Address.parse(address) instanceof SimAddress)) {
            throw new InvalidInputException("--seed " + seed + ": only a sim: meter has a noise seed, not '"
                    + address + "'");
        }
        String kept = address.replaceAll("([?&])seed=[^&]*&?", "$1").replaceAll("[?&]$", "");
        return kept + (kept.contains("?") ? "&" : "?") + "seed=" + seed;
    }

    /**
     * {@code address} with the part {@code serial} in the simulated fixture ({@code &part=SERIAL}, the
     * bench file's {@code parts} entry), for an in-process {@code sim:} address; any other address as it is
     * (a real meter measures whatever part is in its fixture).
     */
    public static String forPart(String address, String serial) {
        if (!(Address.parse(address) instanceof SimAddress sim) || sim.bench().startsWith(REMOTE)) {
            return address;
        }
        String kept = address.replaceAll("([?&])part=[^&]*&?", "$1").replaceAll("[?&]$", "");
        return kept + (kept.contains("?") ? "&" : "?") + "part="
                + java.net.URLEncoder.encode(serial, java.nio.charset.StandardCharsets.UTF_8);
    }

    /** The noise seed of a {@code sim:} address's bench (its {@code seed} option, else its file's); null for any other. */
    public static Long seedOf(String address) {
        if (!(Address.parse(address) instanceof SimAddress sim)) {
            return null;
        }
        String bench = sim.bench();
        if (bench.startsWith(REMOTE)) {
            int q = bench.indexOf("seed=");
            return q < 0 ? null : InProcessSimulator.seed(address, bench.substring(q + 5).split("&")[0]);
        }
        return InProcessSimulator.spec(address).seed();
    }
}
