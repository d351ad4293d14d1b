package org.zweep.simulator.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.simulator.SimulatorInputException;

class BenchFileTest {

    /** The stored bench files, from the simulator module's folder. */
    private static final Path BENCHES = Path.of("..", "sequences", "benches");

    private static String error(String yaml) {
        return assertThrows(SimulatorInputException.class,
                () -> BenchSpec.parse(yaml, "b.yaml", null)).getMessage();
    }

    @Test
    void everyStoredBenchFileLoadsAndMeasures() throws Exception {
        try (Stream<Path> files = Files.list(BENCHES)) {
            long n = files.filter(p -> p.toString().endsWith(".bench.yaml")).peek(p -> {
                SimulatedBench b = new SimulatedBench(BenchSpec.load(p));
                assertTrue(b.limits().maxFrequencyHz() >= 10e6, p + " reaches 10 MHz");
                assertTrue(b.spec().timing() == Timing.REAL, p + " uses real timing");
                PointResult r = b.measure(Requests.at(1e3));
                assertTrue(Double.isFinite(r.real()) && !r.overload(), p.toString());
            }).count();
            assertTrue(n >= 3, "found " + n + " bench files");
        }
    }

    @Test
    void theMlccBenchShowsItsSelfResonanceBelowTheMeterLimit() {
        // SRF = 1/(2π√(ESL·C)), series resonance: 0.8 nH with 100 nF → 17.79 MHz; the
        // 2 nH fixture residual moves the raw one lower, so an ideal fixture is used
        BenchSpec spec = BenchSpec.load(BENCHES.resolve("kp-c0805-104.bench.yaml")).ideal();
        SimulatedBench b = new SimulatedBench(spec);
        double srf = 1 / (2 * Math.PI * Math.sqrt(0.8e-9 * 100e-9));
        assertTrue(b.measure(Requests.voltage(srf * 0.98, 0.01)).imaginary() < 0);
        assertTrue(b.measure(Requests.voltage(srf * 1.02, 0.01)).imaginary() > 0);
        assertTrue(srf < spec.limits().maxFrequencyHz());
    }

    @Test
    void defaultsCoverTheRequiredMeterLimits() {
        MeterLimits l = BenchSpec.ofNetlist("R1 hi lo 1k", "--device").limits();
        assertTrue(l.minFrequencyHz() <= 10 && l.maxFrequencyHz() >= 10e6);
        assertEquals(100, l.sourceResistanceOhm(), 0);
        assertEquals(201, l.maxListPoints());
    }

    @Test
    void aNetlistStringMakesABench() {
        SimulatedBench b = new SimulatedBench(
                BenchSpec.ofNetlist("R1 hi mid 10\nL1 mid lo 1m\nC1 hi lo 100n", "--device")
                        .ideal());
        PointResult r = b.measure(Requests.at(1e3));
        assertEquals(10.079026, r.real(), 1e-6); // computed; ngspice-39 AC analysis of the deck: 1.0079026e+01 6.2445091e+00
        assertEquals(6.244509, r.imaginary(), 1e-6);
    }

    @Test
    void aBadNetlistStringNamesItsSourceAndLine() {
        SimulatorInputException e = assertThrows(SimulatorInputException.class,
                () -> BenchSpec.ofNetlist("R1 hi lo 1k\nQ1 hi lo x", "--device"));
        assertEquals("--device:2:1: unsupported element 'Q1': a device netlist has only R, L, C"
                + " and K elements", e.getMessage());
    }

    @Test
    void inlineNetlistErrorsPointIntoTheBenchFile() {
        String yaml = "seed: 1\n"
                + "device:\n"
                + "  netlist: |\n"
                + "    * a tank\n"
                + "    R1 hi mid 10\n"
                + "    L1 mid lo 1.2.3\n";
        assertEquals("b.yaml:6:15: L1: bad value: '1.2.3' has characters after the number that"
                + " are neither a scale suffix nor unit letters", error(yaml));
    }

    @Test
    void netlistFileIsResolvedAgainstTheBenchFile(@TempDir Path dir) throws Exception {
        Files.writeString(dir.resolve("dut.cir"), "* divider\nR1 hi a 1k\nR2 a lo 1k\n");
        Path bench = dir.resolve("x.bench.yaml");
        Files.writeString(bench, "device:\n  netlist_file: dut.cir\n");
        SimulatedBench b = new SimulatedBench(BenchSpec.load(bench).ideal());
        assertEquals(2000, b.measure(Requests.at(1e3)).real(), 1e-9); // series resistors
        Files.writeString(dir.resolve("dut.cir"), "R1 hi a 1k\nR2 a b 1k\n");
        SimulatorInputException e =
                assertThrows(SimulatorInputException.class, () -> BenchSpec.load(bench));
        assertEquals(dir.resolve("dut.cir") + ":1: no element connects to terminal 'lo'",
                e.getMessage());
    }

    @Test
    void unknownKeyIsReportedWithLineAndColumn() {
        assertEquals("b.yaml:3:3: unknown key 'meter.nosie'; expected one of frequency_min_hz,"
                + " frequency_max_hz, voltage_min_vrms, voltage_max_vrms, current_min_arms,"
                + " current_max_arms, bias_voltage_max_v, bias_current_max_a, list_points_max,"
                + " ranges_ohm, source_resistance_ohm, noise, timing, point_overhead_s,"
                + " bias_settling_s, accuracy", error("seed: 1\nmeter:\n  nosie: 1e-4\n"));
    }

    @Test
    void badValuesAreReportedWithLineAndColumn() {
        assertEquals("b.yaml:3:20: 'device.capacitor.capacitance_f' must be a plain number in SI"
                + " units (e.g. 100e-9), not '100n'",
                error("device:\n  capacitor:\n    capacitance_f: 100n\n"));
        assertEquals("b.yaml:2:11: 'meter.timing' must be one of real, none, not 'fast'",
                error("meter:\n  timing: fast\ndevice:\n  resistor:\n    resistance_ohm: 1\n"));
        assertEquals("b.yaml:3:5: 'device.transformer' needs 'coupling'",
                error("device:\n  transformer:\n    primary_inductance_h: 1e-3\n"
                        + "    turns_ratio: 2\n"));
        assertEquals("b.yaml:2:20: 'meter.ranges_ohm' must be positive and ascending",
                error("meter:\n  ranges_ohm: [10, 1]\ndevice:\n  resistor:\n"
                        + "    resistance_ohm: 1\n"));
    }

    @Test
    void missingDeviceAndBrokenYamlAreReported() {
        assertEquals("b.yaml:1:1: a bench file needs a 'device' section", error("seed: 1\n"));
        assertTrue(error("device: [unclosed\n").startsWith("b.yaml:2:1: not valid YAML: "));
        assertEquals("b.yaml:2:3: the device section needs exactly one of capacitor, inductor,"
                + " resistor, transformer, netlist, netlist_file",
                error("device:\n  capacitor:\n    capacitance_f: 1e-9\n  resistor:\n"
                        + "    resistance_ohm: 1\n"));
    }

    @Test
    void idealVariantDropsNoiseAndResidualsButKeepsTheDevice() {
        BenchSpec spec = BenchSpec.load(BENCHES.resolve("kp-l1210-100.bench.yaml"));
        SimulatedBench ideal = new SimulatedBench(spec.ideal());
        ideal.setSlot(FixtureSlot.SHORT);
        PointResult shorted = ideal.measure(Requests.at(1e6));
        assertEquals(0, shorted.real(), 0);
        assertEquals(0, shorted.imaginary(), 0);
        SimulatedBench real = new SimulatedBench(spec);
        real.setSlot(FixtureSlot.SHORT);
        assertTrue(real.measure(Requests.at(1e6)).imaginary() > 0.01); // 2 nH residual
    }
}
