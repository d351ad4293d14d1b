package org.zweep.simulator.scpi;

import java.time.Instant;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Supplier;

/**
 * The DC bias the meter has applied over time: one entry each time the effective bias (the
 * voltage source's value while its state is on, else 0; the same for the current source)
 * changes. Kept for tests that check bias ramps from the meter's side
 * ({@code SIMulate:BIAS:HISTory?}). Bounded: the oldest entries go first. Thread-safe.
 */
final class BiasHistory {
    /** The most entries kept. */
    static final int CAPACITY = 100_000;

    /**
     * One change of the applied bias.
     *
     * @param timeS when, in seconds since the Unix epoch (microsecond resolution)
     * @param voltageV the applied DC bias voltage (0 when its source is off)
     * @param currentA the applied DC bias current (0 when its source is off)
     */
    record Entry(double timeS, double voltageV, double currentA) {
    }

    private final Supplier<Instant> clock;
    private final ArrayDeque<Entry> entries = new ArrayDeque<>();
    private double voltageV;
    private double currentA;

    BiasHistory(Supplier<Instant> clock) {
        this.clock = clock;
        entries.add(new Entry(now(), 0.0, 0.0));
    }

    /** Records the bias that {@code s} applies, when it differs from the last entry. */
    synchronized void record(Settings s) {
        double v = s.voltageBiasOn ? s.biasVoltageV : 0.0;
        double a = s.currentBiasOn ? s.biasCurrentA : 0.0;
        if (v == voltageV && a == currentA) {
            return;
        }
        voltageV = v;
        currentA = a;
        if (entries.size() >= CAPACITY) {
            entries.removeFirst();
        }
        entries.add(new Entry(now(), v, a));
    }

    /** The entries, oldest first. */
    synchronized List<Entry> entries() {
        return new ArrayList<>(entries);
    }

    /** Forgets every entry but one holding the bias applied now. */
    synchronized void clear() {
        entries.clear();
        entries.add(new Entry(now(), voltageV, currentA));
    }

    private double now() {
        Instant t = clock.get();
        return t.getEpochSecond() + t.getNano() / 1000 * 1e-6;
    }
}
