package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import java.util.function.Function;
import org.junit.jupiter.api.Test;

/**
 * Property: every input pair, computed from an impedance and fed back to its factory, gives the
 * same impedance (common practice, no source: the pairs are exact re-expressions of Z).
 */
class FactoryRoundTripTest {

    private static final int CASES = 5_000;

    private interface Pair extends Function<Impedance, Impedance> {
    }

    private static void assertRoundTrips(String name, Pair pair) {
        SplittableRandom random = new SplittableRandom(0x5eedL + name.hashCode());
        for (int i = 0; i < CASES; i++) {
            double f = Math.pow(10, random.nextDouble(0, 8));
            double m = Math.pow(10, random.nextDouble(-4, 9));
            double theta = random.nextDouble(-179.999, 179.999);
            Impedance z = Impedance.fromPolar(f, m, theta);
            Impedance back = pair.apply(z);
            String where = name + " case " + i + ": " + z;
            assertEquals(z.frequencyHz(), back.frequencyHz(), where);
            assertEquals(z.resistanceOhm(), back.resistanceOhm(), 1e-12 * m, where);
            assertEquals(z.reactanceOhm(), back.reactanceOhm(), 1e-12 * m, where);
        }
    }

    @Test
    void resistanceReactanceRoundTrips() {
        assertRoundTrips("R/X", z -> Impedance.fromRX(z.frequencyHz(), z.resistanceOhm(), z.reactanceOhm()));
    }

    @Test
    void magnitudePhaseRoundTrips() {
        assertRoundTrips("|Z|/θ", z -> Impedance.fromPolar(z.frequencyHz(), z.magnitudeOhm(), z.phaseDeg()));
    }

    @Test
    void seriesCapacitanceAndDRoundTrip() {
        assertRoundTrips("Cs/D", z -> Impedance.fromCsD(z.frequencyHz(), z.seriesCapacitanceF(),
                z.dissipationFactor()));
    }

    @Test
    void parallelCapacitanceAndDRoundTrip() {
        assertRoundTrips("Cp/D", z -> Impedance.fromCpD(z.frequencyHz(), z.parallelCapacitanceF(),
                z.dissipationFactor()));
    }

    @Test
    void seriesInductanceAndQRoundTrip() {
        assertRoundTrips("Ls/Q", z -> Impedance.fromLsQ(z.frequencyHz(), z.seriesInductanceH(), z.qualityFactor()));
    }

    @Test
    void parallelInductanceAndQRoundTrip() {
        assertRoundTrips("Lp/Q", z -> Impedance.fromLpQ(z.frequencyHz(), z.parallelInductanceH(), z.qualityFactor()));
    }

    @Test
    void seriesCapacitanceAndEsrRoundTrip() {
        assertRoundTrips("Cs/ESR", z -> Impedance.fromCsEsr(z.frequencyHz(), z.seriesCapacitanceF(),
                z.seriesResistanceOhm()));
    }

    @Test
    void parallelCapacitanceAndRpRoundTrip() {
        assertRoundTrips("Cp/Rp", z -> Impedance.fromCpRp(z.frequencyHz(), z.parallelCapacitanceF(),
                z.parallelResistanceOhm()));
    }

    @Test
    void seriesInductanceAndRsRoundTrip() {
        assertRoundTrips("Ls/Rs", z -> Impedance.fromLsRs(z.frequencyHz(), z.seriesInductanceH(),
                z.seriesResistanceOhm()));
    }

    @Test
    void parallelInductanceAndRpRoundTrip() {
        assertRoundTrips("Lp/Rp", z -> Impedance.fromLpRp(z.frequencyHz(), z.parallelInductanceH(),
                z.parallelResistanceOhm()));
    }
}
