package org.zweep.runner.compensation;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.uncertainty.UncertainImpedance;

/**
 * The uncertainty of a host-corrected reading (the reading's own and each standard's, through the
 * open/short or open/short/load correction) against a Monte Carlo propagation of the same inputs
 * through the same correction (JCGM 101:2008, the propagation of distributions).
 */
class CompensationUncertaintyTest {

    private static final double F = 1e6;

    /** u of 1e-3 relative on each part, r = 0.3, for any reading. */
    private static UncertainImpedance u(Impedance z) {
        return new UncertainImpedance(z, 1e-3 * z.magnitudeOhm(), 1e-3 * z.magnitudeOhm(), 0.3);
    }

    private static double[] draw(UncertainImpedance u, Random random) {
        double e1 = random.nextGaussian();
        double e2 = u.correlation() * e1 + Math.sqrt(1 - u.correlation() * u.correlation()) * random.nextGaussian();
        return new double[] {u.value().resistanceOhm() + u.uROhm() * e1, u.value().reactanceOhm() + u.uXOhm() * e2};
    }

    private static void agreesWithMonteCarlo(List<CompensationData.Entry> standards, Impedance load, Reading raw) {
        agreesWithMonteCarloStated(standards, load == null ? null : UncertainImpedance.exact(load), raw);
    }

    private static void agreesWithMonteCarloStated(List<CompensationData.Entry> standards, UncertainImpedance load,
            Reading raw) {
        CompensationData d = new CompensationData(HostCorrectorTest.info(standards.stream()
                .map(e -> e.standard().name()).toList()), standards);
        HostCorrector c = HostCorrector.withStatedLoad(d, "test", load);
        Impedance rawZ = new Impedance(F, raw.real(), raw.imaginary());
        UncertainImpedance linear = c.uncertainty(raw, u(rawZ), CompensationUncertaintyTest::u);

        Random random = new Random(42);
        int n = 20_000;
        double sr = 0;
        double sx = 0;
        double srr = 0;
        double sxx = 0;
        double srx = 0;
        for (int i = 0; i < n; i++) {
            List<CompensationData.Entry> drawn = standards.stream().map(e -> {
                double[] v = draw(u(new Impedance(F, e.rOhm(), e.xOhm())), random);
                return HostCorrectorTest.e(e.standard(), F, v[0], v[1]);
            }).toList();
            double[] m = draw(u(rawZ), random);
            UncertainImpedance drawnLoad = null;
            if (load != null) {
                double[] l = draw(load, random);
                drawnLoad = UncertainImpedance.exact(new Impedance(F, l[0], l[1]));
            }
            Reading out = HostCorrector.withStatedLoad(new CompensationData(d.info(), drawn), "mc", drawnLoad)
                    .correct(HostCorrectorTest.reading(F, m[0], m[1]));
            sr += out.real();
            sx += out.imaginary();
            srr += out.real() * out.real();
            sxx += out.imaginary() * out.imaginary();
            srx += out.real() * out.imaginary();
        }
        double mr = sr / n;
        double mx = sx / n;
        double vr = srr / n - mr * mr;
        double vx = sxx / n - mx * mx;
        double cov = srx / n - mr * mx;
        // 20 000 draws estimate a standard deviation to about 0.5 % (1/sqrt(2n)), a quarter of the 2 % allowed; the linear law is exact to first order
        assertEquals(Math.sqrt(vr), linear.uROhm(), 0.02 * linear.uROhm());
        assertEquals(Math.sqrt(vx), linear.uXOhm(), 0.02 * linear.uXOhm());
        assertEquals(cov / Math.sqrt(vr * vx), linear.correlation(), 0.02);
    }

    @Test
    void openShortCorrectionPropagatesTheReadingsAndTheStandardsUncertainties() {
        // a 100 Ω, −1 kΩ part behind 0.05 Ω + 20 nH and 1 nS + 5 pF (the residuals of HostCorrectorTest)
        agreesWithMonteCarlo(List.of(
                HostCorrectorTest.e(CorrectionStandard.OPEN, F, 1.0632118354, -31830.8629224),
                HostCorrectorTest.e(CorrectionStandard.SHORT, F, 0.05, 0.125663706144)),
                null, HostCorrectorTest.reading(F, 0.550197489669, 6.41008164433));
    }

    @Test
    void openShortLoadCorrectionPropagatesAllThreeStandards() {
        agreesWithMonteCarlo(List.of(
                HostCorrectorTest.e(CorrectionStandard.OPEN, F, 10500, -30500),
                HostCorrectorTest.e(CorrectionStandard.SHORT, F, 0.264363030808, 2.04621149042),
                HostCorrectorTest.e(CorrectionStandard.LOAD, F, 104.197060198, 4.86376149172)),
                new Impedance(F, 100, 0), HostCorrectorTest.reading(F, 0.587717263528, 8.59911787287));
    }

    @Test
    void openShortLoadCorrectionPropagatesTheLoadStandardsStatedUncertainty() {
        // the load standard stated as 100 Ω ± 0.1 Ω, −0 ± 0.05 Ω (standard uncertainties): enough to
        // dominate the readings' 1e-3 relative; the Monte Carlo draws the load's value as well
        agreesWithMonteCarloStated(List.of(
                HostCorrectorTest.e(CorrectionStandard.OPEN, F, 10500, -30500),
                HostCorrectorTest.e(CorrectionStandard.SHORT, F, 0.264363030808, 2.04621149042),
                HostCorrectorTest.e(CorrectionStandard.LOAD, F, 104.197060198, 4.86376149172)),
                new UncertainImpedance(new Impedance(F, 100, 0), 0.1, 0.05, 0),
                HostCorrectorTest.reading(F, 0.587717263528, 8.59911787287));
    }

    @Test
    void theLoadStandardsRelativeUncertaintyPassesOneToOneToTheCorrectedValue() {
        // Z = Z_std·F(readings), so with exact readings u(Z)/|Z| = u(Z_std)/|Z_std| for a load whose
        // u is the same fraction on both parts (follows from the open/short/load formula)
        CompensationData d = new CompensationData(HostCorrectorTest.info(List.of("OPEN", "SHORT", "LOAD")), List.of(
                HostCorrectorTest.e(CorrectionStandard.OPEN, F, 10500, -30500),
                HostCorrectorTest.e(CorrectionStandard.SHORT, F, 0.264363030808, 2.04621149042),
                HostCorrectorTest.e(CorrectionStandard.LOAD, F, 104.197060198, 4.86376149172)));
        HostCorrector exact = new HostCorrector(d, "test", new Impedance(F, 100, 0));
        HostCorrector stated = HostCorrector.withStatedLoad(d, "test", new UncertainImpedance(new Impedance(F, 100, 0),
                0.05, 0.05, 0)); // 0.05 % of 100 Ω on R and on X
        Reading raw = HostCorrectorTest.reading(F, 0.587717263528, 8.59911787287);
        Impedance rawZ = new Impedance(F, raw.real(), raw.imaginary());
        UncertainImpedance none = exact.uncertainty(raw, UncertainImpedance.exact(rawZ),
                z -> UncertainImpedance.exact(z));
        UncertainImpedance withLoad = stated.uncertainty(raw, UncertainImpedance.exact(rawZ),
                z -> UncertainImpedance.exact(z));
        assertEquals(0.0, none.uROhm(), 0.0);
        double magnitude = withLoad.value().magnitudeOhm();
        assertEquals(5e-4 * magnitude, withLoad.uROhm(), 1e-9 * magnitude);
        assertEquals(5e-4 * magnitude, withLoad.uXOhm(), 1e-9 * magnitude);
        assertEquals(5e-4 * magnitude, withLoad.standardUncertainty(org.zweep.driver.impedance.DerivedParameter.Z),
                1e-9 * magnitude);
    }
}
