package org.zweep.simulator.scpi;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.zweep.simulator.bench.FixtureSlot;
import org.zweep.simulator.bench.PointRequest;
import org.zweep.simulator.bench.Wiring;

/**
 * The noise keys of the simulated meter's triggers, so that its noise is reproducible by itself,
 * whatever connection asks and whatever the client sends: a trigger's key is made of what it
 * measures (every point's setting, what the fixture holds, the second winding, the standard being
 * acquired) and of how often that same trigger came before. A trigger repeated right after itself
 * counts as the same one: a reading lost on the way (a dropped link, a timeout, a garbled reply)
 * and measured again comes back the same. The same trigger measured again after others draws new
 * noise. A trigger's points use the key, key + 1, … Thread-safe.
 */
final class NoiseKeys {
    private final Map<Long, Long> seen = new HashMap<>();
    private long last;
    private boolean any;

    /**
     * The key of a trigger measuring {@code points} (their own keys ignored) with {@code slot} in
     * the fixture and the second winding {@code wiring}; {@code standard} is the correction
     * standard acquired (-1 for a measurement).
     */
    synchronized long draw(List<PointRequest> points, FixtureSlot slot, Wiring wiring, int standard) {
        long signature = signature(points, slot, wiring, standard);
        long occurrence;
        if (any && signature == last) {
            occurrence = seen.get(signature) - 1;
        } else {
            occurrence = seen.merge(signature, 1L, Long::sum) - 1;
            last = signature;
            any = true;
        }
        return mix(signature, occurrence);
    }

    /** Forgets every trigger seen. */
    synchronized void restart() {
        seen.clear();
        any = false;
    }

    static long signature(List<PointRequest> points, FixtureSlot slot, Wiring wiring, int standard) {
        long h = mix(0x5EED_0F_F1C7L, slot.ordinal());
        h = mix(h, wiring.ordinal());
        h = mix(h, standard);
        for (PointRequest p : points) {
            h = mix(h, p.voltageRatio() ? 1 : 0);
            h = mix(h, Double.doubleToLongBits(p.frequencyHz()));
            h = mix(h, p.drive().ordinal());
            h = mix(h, Double.doubleToLongBits(p.driveLevelRms()));
            h = mix(h, p.bias().ordinal());
            h = mix(h, Double.doubleToLongBits(p.biasValue()));
            h = mix(h, p.biasOn() ? 1 : 0);
            h = mix(h, p.averages());
            h = mix(h, Double.doubleToLongBits(p.apertureS()));
            h = mix(h, Double.doubleToLongBits(p.rangeUpperOhm()));
        }
        return h;
    }

    /** Folds {@code v} into {@code h} (the SplitMix64 finaliser). */
    static long mix(long h, long v) {
        long z = h ^ (v + 0x9E3779B97F4A7C15L + (h << 6) + (h >>> 2));
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }
}
