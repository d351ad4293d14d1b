package org.zweep.simulator.scpi;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

/** Talks to an {@link Instrument} through one {@link Session}, without sockets. */
final class Console implements AutoCloseable {
    final TestBench bench;
    final Instrument instrument;
    final Session session;

    Console(TestBench bench, InstrumentOptions options, Sleeper sleeper) {
        this.bench = bench;
        this.instrument = new Instrument(bench, options, b -> { }, sleeper);
        this.session = instrument.openSession(Session.Hooks.NONE);
    }

    /** An ideal resistor bench, no timing, a 16-entry queue. */
    Console() {
        this(TestBench.resistor(), InstrumentOptions.defaults().withTiming(TimingModel.NONE), Sleeper.THREAD);
    }

    /** Sends {@code message}; returns the reply without its LF, or {@code null} for none. */
    String send(String message) {
        byte[] r = session.execute(message.getBytes(StandardCharsets.ISO_8859_1));
        if (r == null) {
            return null;
        }
        return new String(r, 0, r.length - 1, StandardCharsets.ISO_8859_1);
    }

    /** The raw reply bytes, terminator included. */
    byte[] raw(String message) {
        return session.execute(message.getBytes(StandardCharsets.ISO_8859_1));
    }

    /** Reads the error queue empty; returns the entries, oldest first (without the final 0). */
    List<String> errors() {
        List<String> out = new ArrayList<>();
        while (true) {
            String e = send("SYST:ERR?");
            if (e.startsWith("0,")) {
                return out;
            }
            out.add(e);
        }
    }

    /** The error numbers in the queue, oldest first; reading empties it. */
    List<Integer> codes() {
        List<Integer> out = new ArrayList<>();
        for (String e : errors()) {
            out.add(Integer.parseInt(e.substring(0, e.indexOf(','))));
        }
        return out;
    }

    double number(String query) {
        return Double.parseDouble(send(query));
    }

    @Override
    public void close() {
        instrument.close();
    }
}
