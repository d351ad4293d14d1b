package org.zweep.runner.it;

import java.util.ArrayList;
import java.util.List;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;

/**
 * The simulator's record of the DC bias it applied ({@code SIMulate:BIAS:HISTory?}), read from the
 * meter's side, and the ramp figures tests check on it.
 *
 * @param entries the changes, oldest first
 */
record BiasTrace(List<Entry> entries) {

    /** One change: when (s since the epoch), the applied voltage (V) and current (A). */
    record Entry(double timeS, double voltageV, double currentA) {
        double value(boolean current) {
            return current ? currentA : voltageV;
        }
    }

    /** Reads the history from the simulator at {@code address} over a new connection. */
    static BiasTrace read(String address) {
        try (ScpiClient c = ScpiClient.open(address, ScpiSettings.DEFAULTS)) {
            double[] v = c.queryNumbers(":SIM:BIAS:HIST?");
            List<Entry> out = new ArrayList<>();
            for (int i = 0; i + 2 < v.length; i += 3) {
                out.add(new Entry(v[i], v[i + 1], v[i + 2]));
            }
            return new BiasTrace(out);
        }
    }

    /** Clears the history of the simulator at {@code address}. */
    static void clear(String address) {
        try (ScpiClient c = ScpiClient.open(address, ScpiSettings.DEFAULTS)) {
            c.write(":SIM:BIAS:HIST:CLE");
            c.checkErrors("clearing the bias history");
        }
    }

    /** The largest |value| reached. */
    double peak(boolean current) {
        return entries.stream().mapToDouble(e -> Math.abs(e.value(current))).max().orElse(0.0);
    }

    /** The last entry. */
    Entry last() {
        return entries.get(entries.size() - 1);
    }

    /**
     * The largest change between any two entries beyond {@code rampPerS} times the time between
     * them, in V or A: 0 or less when the bias never moved faster than the ramp; one ramp step
     * when the meter saw two steps closer together than they were sent.
     */
    double largestExcess(boolean current, double rampPerS) {
        double worst = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < entries.size(); i++) {
            for (int j = i + 1; j < entries.size(); j++) {
                Entry a = entries.get(i);
                Entry b = entries.get(j);
                worst = Math.max(worst, Math.abs(b.value(current) - a.value(current)) - rampPerS * (b.timeS() - a.timeS()));
            }
        }
        return worst;
    }

    /**
     * The largest rate of change over any span of at least {@code minSpanS}, in V/s or A/s (the
     * ramp rate as seen by the meter, smoothed over the jitter of single steps).
     */
    double largestRate(boolean current, double minSpanS) {
        double worst = 0.0;
        for (int i = 0; i < entries.size(); i++) {
            for (int j = i + 1; j < entries.size(); j++) {
                Entry a = entries.get(i);
                Entry b = entries.get(j);
                double dt = b.timeS() - a.timeS();
                if (dt >= minSpanS) {
                    worst = Math.max(worst, Math.abs(b.value(current) - a.value(current)) / dt);
                    break;
                }
            }
        }
        return worst;
    }
}
