package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;
import org.zweep.simulator.server.FaultPlan;
import org.zweep.simulator.server.SimulatorServer;

/**
 * The fixture channels of a run without a terminal: lines on stdin, lines through named pipes and
 * a command hook each switch what is in the fixture (here: the TCP simulator's fixture, switched
 * by the test or the hook over a connection of its own, as a handler would), and give exactly the
 * points of a run whose meter switches its own fixture; {@code abort} and a failing hook stop the
 * run with DC bias off and a resumable folder.
 */
class FixtureChannelsIT {
    static final Path SEQ = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");

    @TempDir
    Path dir;

    /** The simulator's own command that brings its fixture to {@code state}. */
    static String command(String state) {
        return switch (state) {
            case "PART" -> ":SIM:FIXT DEV";
            case "OPEN" -> ":SIM:FIXT OPEN";
            case "SHORT" -> ":SIM:FIXT SHOR";
            case "LOAD" -> ":SIM:FIXT LOAD";
            case "SECONDARY_OPEN" -> ":SIM:SEC OPEN";
            case "SECONDARY_SHORTED" -> ":SIM:SEC SHOR";
            default -> throw new AssertionError("unknown state " + state);
        };
    }

    static void switchFixture(SimulatorServer server, String state) {
        try (ScpiClient c = ScpiClient.open("tcp://127.0.0.1:" + server.port(), ScpiSettings.DEFAULTS)) {
            c.write(command(state));
            c.query("*OPC?");
        }
    }

    List<String> args(SimulatorServer server, Path out, String... extra) {
        List<String> a = new ArrayList<>(List.of("run", SEQ.toString(), "--meter", Sims.address(server),
                "--dialect", Sims.dialect(), "--out", out.toString(), "--quiet"));
        a.addAll(List.of(extra));
        return a;
    }

    Map<Integer, PointRow> reference() {
        Path ref = dir.resolve("reference").resolve("run"); // a folder of its own: no compensation to reuse
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.none())) {
            Sims.Result r = Sims.zweep(args(server, ref).toArray(String[]::new));
            assertEquals(0, r.code(), r.out() + r.err());
        }
        return Rows.of(ref);
    }

    /** A child zweep with its stdin and stdout as pipes to this test (stderr to {@code log}). */
    static Process child(Path log, List<String> zweepArgs) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> cmd = new ArrayList<>(List.of("env", "--default-signal=INT,TERM", java, "-cp",
                System.getProperty("java.class.path"), "org.zweep.runner.cli.Main"));
        cmd.addAll(zweepArgs);
        ProcessBuilder pb = new ProcessBuilder(cmd);
        pb.redirectError(log.toFile());
        return pb.start();
    }

    /**
     * Serves fixture requests read from {@code requests}: switches the simulator, answers {@code ok}
     * (or {@code abort} for {@code abortAt}); returns the states asked for.
     */
    static List<String> serve(BufferedReader requests, java.util.function.Supplier<Writer> answers,
            SimulatorServer server, String abortAt) throws IOException {
        List<String> asked = new ArrayList<>();
        String line;
        while ((line = requests.readLine()) != null) {
            if (!line.startsWith("fixture ")) {
                continue;
            }
            String state = line.split(" ")[1];
            asked.add(state);
            boolean abort = state.equals(abortAt);
            if (!abort) {
                switchFixture(server, state);
            }
            try (Writer w = answers.get()) {
                w.write(abort ? "abort\n" : "ok\n");
            }
            if (abort) {
                break;
            }
        }
        return asked;
    }

    @Test
    void linesOnStdinChangeTheFixtureAndGiveThePointsOfTheMetersOwnFixture() throws Exception {
        Map<Integer, PointRow> expected = reference();
        Path out = dir.resolve("stdin").resolve("run"); // a folder of its own: no compensation to reuse
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.none())) {
            switchFixture(server, "LOAD"); // whatever it held before: the channel must say what it needs
            Process p = child(dir.resolve("stdin.log"), args(server, out, "--fixture", "stdin"));
            PrintWriter toChild = new PrintWriter(new OutputStreamWriter(p.getOutputStream(), StandardCharsets.UTF_8));
            List<String> asked = serve(new BufferedReader(new InputStreamReader(p.getInputStream(),
                    StandardCharsets.UTF_8)), () -> new Writer() {
                        @Override
                        public void write(char[] b, int off, int len) {
                            toChild.write(b, off, len);
                        }

                        @Override
                        public void flush() {
                            toChild.flush();
                        }

                        @Override
                        public void close() {
                            toChild.flush();
                        }
                    }, server, null);
            assertTrue(p.waitFor(120, TimeUnit.SECONDS), "child ended");
            assertEquals(0, p.exitValue(), Files.readString(dir.resolve("stdin.log")));
            // the host-side standards first, then the part (the shipped sequence's order)
            assertEquals(List.of("OPEN", "SHORT", "PART"), asked);
        }
        Map<Integer, PointRow> actual = Rows.of(out);
        assertEquals(expected.keySet(), actual.keySet());
        for (Integer k : expected.keySet()) {
            assertEquals(Rows.timeless(expected.get(k)), Rows.timeless(actual.get(k)), "point " + k);
        }
    }

    @Test
    void abortOnANamedPipeStopsTheRunBeforeThePartWithAResumableFolder() throws Exception {
        Path fifo = dir.resolve("fixture");
        Path reply = dir.resolve("fixture.reply");
        for (Path f : List.of(fifo, reply)) {
            assertEquals(0, new ProcessBuilder("mkfifo", f.toString()).inheritIO().start().waitFor(), "mkfifo");
        }
        Path out = dir.resolve("piped").resolve("run"); // a folder of its own: no compensation to reuse
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.none())) {
            Process p = child(dir.resolve("piped.log"), args(server, out, "--fixture", "pipe:" + fifo));
            List<String> asked = new ArrayList<>();
            // each request opens the pipe afresh: read one line per opening, as a shell loop would
            while (asked.isEmpty() || !asked.get(asked.size() - 1).equals("SHORT")) {
                try (BufferedReader r = Files.newBufferedReader(fifo, StandardCharsets.UTF_8)) {
                    asked.addAll(serve(r, () -> {
                        try {
                            return Files.newBufferedWriter(reply, StandardCharsets.UTF_8);
                        } catch (IOException e) {
                            throw new java.io.UncheckedIOException(e);
                        }
                    }, server, "SHORT"));
                }
            }
            assertTrue(p.waitFor(60, TimeUnit.SECONDS), "child ended");
            String log = Files.readString(dir.resolve("piped.log"));
            assertEquals(130, p.exitValue(), log);
            assertEquals(List.of("OPEN", "SHORT"), asked);
            assertTrue(log.contains("abort answered on pipe:" + fifo + " at the request for SHORT"), log);
            assertTrue(Sims.biasOff(server), "bias off");
        }
        assertEquals("aborted", RunManifest.read(out.resolve("run.json")).outcome());
    }

    @Test
    void aHookCommandChangesTheFixtureAndANonZeroExitStopsTheRunWithBiasOff() throws Exception {
        Map<Integer, PointRow> expected = reference();
        Path log = dir.resolve("hook.log");
        try (SimulatorServer server = Sims.tcp(Sims.benchOf(SEQ), FaultPlan.none())) {
            // the hook switches the simulator's fixture over a connection of its own, as a handler's driver would
            Path hook = dir.resolve("hook.sh");
            Files.writeString(hook, "#!/bin/bash\n"
                    + "echo \"$1 $ZWEEP_FIXTURE\" >> " + log + "\n"
                    + "case \"$1\" in PART) c=':SIM:FIXT DEV';; OPEN) c=':SIM:FIXT OPEN';; SHORT) c=':SIM:FIXT SHOR';;"
                    + " *) exit 7;; esac\n"
                    + "exec 3<>/dev/tcp/127.0.0.1/" + server.port() + "\n"
                    + "printf '%s;*OPC?\\n' \"$c\" >&3\nread -r answer <&3\n");
            assertTrue(hook.toFile().setExecutable(true));
            Path out = dir.resolve("hooked").resolve("run"); // a folder of its own: no compensation to reuse
            Sims.Result r = Sims.zweep(args(server, out, "--fixture-command", hook.toString()).toArray(String[]::new));
            assertEquals(0, r.code(), r.out() + r.err());
            assertEquals(List.of("OPEN OPEN", "SHORT SHORT", "PART PART"), Files.readAllLines(log));
            Map<Integer, PointRow> actual = Rows.of(out);
            for (Integer k : expected.keySet()) {
                assertEquals(Rows.timeless(expected.get(k)), Rows.timeless(actual.get(k)), "point " + k);
            }
            Path failed = dir.resolve("failed").resolve("run"); // a folder of its own: no compensation to reuse
            // the state comes as the argument: the hook fails at SHORT
            String failing = "f() { test \"$1\" != SHORT; }; f";
            Sims.Result f = Sims.zweep(args(server, failed, "--fixture-command", failing).toArray(String[]::new));
            assertEquals(130, f.code(), f.out() + f.err());
            assertTrue(f.err().contains("the fixture command '" + failing + " SHORT' exited with 1"), f.err());
            assertTrue(Sims.biasOff(server), "bias off");
            assertEquals("aborted", RunManifest.read(failed.resolve("run.json")).outcome());
        }
    }
}
