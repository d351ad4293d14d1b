package org.zweep.runner.it;

import org.zweep.runner.testsupport.Ngspice;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.results.PointRow;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * Host-side open/short compensation survives a real open: where the OPEN reads beyond the meter's
 * range (overload) its admittance is taken as 0, recorded per frequency in
 * {@code compensation/host.csv} and {@code run.json}, and the corrected readings still recover the
 * device netlist's impedance as ngspice computes it (AC analysis, 1 V source, Z = V/I), over the
 * whole sweep. A SHORT that overloads is refused, naming the standard and the frequency.
 */
class HostCompensationOverloadIT {
    /** A 10 nF film capacitor with 50 mΩ ESR, 5 nH ESL and 1 GΩ leakage; nodes {@code A} and {@code B}. */
    static final String DEVICE = "C1 A n1 10n\nR1 n1 n2 50m\nL1 n2 B 5n\nR2 A B 1g\n";

    @TempDir
    Path dir;


    /** The device's impedance by ngspice at {@code ac} (e.g. {@code dec 5 100 1meg}). */
    private List<Impedance> ngspiceSweep(String ac) throws Exception {
        Path out = dir.resolve("z.txt");
        String deck = "* device\nV1 in 0 DC 0 AC 1\n" + DEVICE.replace(" A ", " in ").replace(" B\n", " 0\n")
                .replace(" B ", " 0 ") + ".control\nset wr_singlescale\nset wr_vecnames\noption numdgt=15\nac " + ac
                + "\nlet z = v(in)/(-i(V1))\nwrdata " + out + " real(z) imag(z)\nquit\n.endc\n.end\n";
        Path cir = dir.resolve("deck.cir");
        Files.writeString(cir, deck);
        Process p = new ProcessBuilder(Ngspice.executable(), "-b", cir.toString()).redirectErrorStream(true)
                .redirectOutput(dir.resolve("ngspice.log").toFile()).start();
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "ngspice finished");
        assertEquals(0, p.exitValue(), Files.readString(dir.resolve("ngspice.log")));
        List<Impedance> z = new ArrayList<>();
        for (String line : Files.readAllLines(out)) {
            String[] c = line.strip().split("\\s+");
            if (c[0].matches("[-+0-9.eE]+")) {
                z.add(new Impedance(Double.parseDouble(c[0]), Double.parseDouble(c[1]), Double.parseDouble(c[2])));
            }
        }
        return z;
    }

    /** A bench file for {@link #DEVICE} with {@code meter} and {@code fixture} sections. */
    private Path bench(String meterAndFixture) throws Exception {
        Path p = dir.resolve("device.bench.yaml");
        StringBuilder netlist = new StringBuilder("device:\n  netlist: |\n    * 10 nF film capacitor\n");
        DEVICE.lines().forEach(l -> netlist.append("    ").append(l.replace(" A ", " hi ").replace(" B", " lo")
                .replace(" hi lo", " hi lo")).append('\n'));
        Files.writeString(p, "seed: 7\n" + meterAndFixture + netlist);
        return p;
    }

    private static SimulatorServer server(BenchSpec spec) throws Exception {
        return SimulatorServer.start(new SimulatedBench(spec), ServerOptions.defaults().withPort(0)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
    }

    private Path sequence(String range) throws Exception {
        Path seq = dir.resolve("comp.yaml");
        Files.writeString(seq, """
                format: zweep-sequence/1
                name: open-overload
                meter: {address: "tcp://127.0.0.1:1"}
                safety: {max_bias_voltage: 0 V, max_bias_current: 0 A, max_level_voltage: 1 V, max_level_current: 0 A}
                fixture: {terminals: 4, compensation: host, standards: [open, short]}
                part: {kind: capacitor, nominal: 10 nF, tolerance: K}
                steps:
                  - name: sweep
                    frequency: {start: 100 Hz, stop: 1 MHz, per_decade: 5}
                    level: 0.5 V
                    range: %s
                """.formatted(range));
        return seq;
    }

    /** Runs the sweep against {@code spec} and checks every corrected point against ngspice within {@code relative}. */
    private JsonNode recovers(BenchSpec spec, double relative) throws Exception {
        List<Impedance> reference = ngspiceSweep("dec 5 100 1meg");
        Path out = dir.resolve("run");
        try (SimulatorServer s = server(spec)) {
            Sims.Result r = Sims.zweep("run", sequence("auto").toString(), "--meter", Sims.address(s),
                    "--dialect", Sims.dialect(), "--out", out.toString(), "--yes", "--quiet");
            assertEquals(0, r.code(), r.out() + r.err());
        }
        Map<Integer, PointRow> rows = Rows.of(out);
        assertEquals(reference.size(), rows.size());
        for (PointRow row : rows.values()) {
            Impedance ref = reference.stream()
                    .filter(z -> Math.abs(z.frequencyHz() - row.frequencyHz()) <= 1e-6 * row.frequencyHz())
                    .findFirst().orElseThrow(() -> new AssertionError("no ngspice point at " + row.frequencyHz()));
            double err = Math.hypot(row.rOhm() - ref.resistanceOhm(), row.xOhm() - ref.reactanceOhm())
                    / ref.magnitudeOhm();
            assertTrue(err <= relative, "at " + row.frequencyHz() + " Hz: " + row.rOhm() + " + j" + row.xOhm()
                    + " against ngspice " + ref.resistanceOhm() + " + j" + ref.reactanceOhm() + " (" + err + ")");
        }
        return new ObjectMapper().readTree(out.resolve("run.json").toFile());
    }

    @Test
    void anIdealFixtureWhoseOpenOverloadsEverywhereStillRecoversTheNetlist() throws Exception {
        // --ideal: no residuals, no strays, no noise; the open is an infinite impedance at every frequency
        BenchSpec spec = BenchSpec.load(bench("")).ideal();
        JsonNode run = recovers(spec, 1e-6); // ngspice reference; 1e-6: the two solvers' rounding
        JsonNode over = run.at("/compensation/open_over_range_hz");
        assertEquals(21, over.size(), run.toPrettyString()); // 100 Hz .. 1 MHz, 5 per decade
        String csv = Files.readString(dir.resolve("run/compensation/host.csv"));
        assertEquals(21, csv.lines().filter(l -> l.startsWith("OPEN,") && l.endsWith(",over_range")).count(), csv);
    }

    @Test
    void anOpenThatOverloadsOnlyAtLowFrequenciesIsTakenAsZeroThereAndUsedAboveIt() throws Exception {
        // meter ranges up to 100 kΩ (auto ranging reads up to 1000 × the top range, 100 MΩ); 1 pF stray across
        // the slot is 100 MΩ at 1.6 kHz: the open overloads below about 1.6 kHz and is read above
        BenchSpec spec = BenchSpec.load(bench("""
                meter:
                  ranges_ohm: [1, 10, 100, 1000, 1.0e4, 1.0e5]
                  noise: 0
                fixture:
                  connection: 4-terminal
                  residual_resistance_ohm: 0.5
                  residual_inductance_h: 100.0e-9
                  stray_conductance_s: 0
                  stray_capacitance_f: 1.0e-12
                  lead_resistance_ohm: 0
                """));
        // where the open is taken as 0 the 1 pF stray is left in: 1 pF against 10 nF is 1e-4; elsewhere the
        // correction is exact (open/short on this fixture topology, common practice, no source)
        JsonNode run = recovers(spec, 2e-4);
        JsonNode over = run.at("/compensation/open_over_range_hz");
        assertTrue(over.size() > 0 && over.size() < 21, run.toPrettyString());
        for (JsonNode f : over) {
            assertTrue(f.asDouble() < 1.7e3, "the open overloads only below 1.6 kHz: " + f);
        }
    }

    @Test
    void aShortThatOverloadsIsRefusedNamingTheStandardAndTheFrequency() throws Exception {
        // a range held at 100 kΩ reads nothing below 10 Ω (U/10⁴): the short overloads at the first frequency
        BenchSpec spec = BenchSpec.load(bench("")).ideal();
        try (SimulatorServer s = server(spec)) {
            Sims.Result r = Sims.zweep("run", sequence("100 kΩ").toString(), "--meter",
                    Sims.address(s), "--dialect", Sims.dialect(), "--out", dir.resolve("run").toString(),
                    "--yes", "--quiet");
            assertEquals(3, r.code(), r.out() + r.err());
            assertTrue(r.err().contains("the SHORT standard overloaded the meter at 100 Hz"), r.err());
            assertFalse(r.err().contains("OPEN"), r.err());
        }
    }
}
