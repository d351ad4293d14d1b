package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.FolderLock;
import org.zweep.runner.results.PointRow;
import org.zweep.runner.results.RunManifest;

/**
 * Run folders that cannot be corrupted: the folder lock, the sequence copy's hash, repeated point
 * indices, interruptions before the first point and during compensation, refused folders.
 */
class RunFolderIntegrityIT {
    static final Path SEQ = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");

    @TempDir
    Path dir;

    static String sim() {
        return "sim:" + Sims.benchOf(SEQ) + "?timing=none";
    }

    Sims.Result run(Path out) {
        return Sims.zweep("run", SEQ.toString(), "--meter", sim(), "--dialect", Sims.dialect(), "--out",
                out.toString(), "--seed", "5", "--quiet");
    }

    static Sims.Result resume(Path out) {
        return Sims.zweep("run", "--resume", out.toString(), "--meter", sim(), "--dialect", Sims.dialect(), "--quiet");
    }

    /** A completed run cut back to its first {@code keep} rows, its manifest saying it failed: resumable. */
    Map<Integer, PointRow> unfinished(Path out, int keep) throws IOException {
        Sims.Result r = run(out);
        assertEquals(0, r.code(), r.out() + r.err());
        Map<Integer, PointRow> all = Rows.of(out);
        Path csv = out.resolve("points.csv");
        List<String> lines = Files.readAllLines(csv, StandardCharsets.UTF_8);
        Files.write(csv, lines.subList(0, keep + 1), StandardCharsets.UTF_8);
        RunManifest m = RunManifest.read(out.resolve("run.json"));
        m.finished("failed", null, new RunManifest.Counts(m.counts().planned(), keep), "none")
                .write(out.resolve("run.json"));
        return all;
    }

    static void assertSamePoints(Map<Integer, PointRow> expected, Path out) {
        Map<Integer, PointRow> actual = Rows.of(out);
        assertEquals(expected.keySet(), actual.keySet(), "nothing lost or duplicated");
        for (Integer k : expected.keySet()) {
            assertEquals(Rows.timeless(expected.get(k)), Rows.timeless(actual.get(k)), "point " + k);
        }
    }

    static Process child(String... args) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> cmd = new ArrayList<>(List.of("env", "--default-signal=INT,TERM", java, "-cp",
                System.getProperty("java.class.path"), "org.zweep.runner.cli.Main"));
        cmd.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(cmd);
        pb.redirectErrorStream(true);
        return pb.start();
    }

    @Test
    void resumeOfAFolderAnotherProcessHoldsIsRefusedWithExit2NamingTheHolder() throws Exception {
        Path out = dir.resolve("held");
        unfinished(out, 10);
        // another process holds the folder: a child JVM resuming it against a meter that never answers
        try (ServerSocket silent = new ServerSocket(0)) {
            Thread acceptor = new Thread(() -> {
                List<Socket> keep = new ArrayList<>();
                try {
                    while (true) {
                        keep.add(silent.accept());
                    }
                } catch (IOException e) {
                    keep.forEach(s -> {
                        try {
                            s.close();
                        } catch (IOException ignored) {
                            // closing
                        }
                    });
                }
            });
            acceptor.start();
            Process holder = child("run", "--resume", out.toString(), "--meter", "tcp://127.0.0.1:" + silent.getLocalPort(),
                    "--dialect", Sims.dialect(), "--timeout", "60", "--quiet");
            try {
                awaitLockHeld(out.resolve(FolderLock.FILE), holder);
                Sims.Result second = resume(out);
                assertEquals(2, second.code(), second.out() + second.err());
                assertTrue(second.err().contains("in use by another zweep run (pid " + holder.pid() + " on "),
                        second.err());
                assertEquals(11, Files.readAllLines(out.resolve("points.csv")).size(), "nothing written");
            } finally {
                holder.destroyForcibly().waitFor(10, TimeUnit.SECONDS);
            }
        }
        // the holder is gone (killed hard): the system released its lock and the resume completes
        Sims.Result r = resume(out);
        assertEquals(0, r.code(), r.out() + r.err());
    }

    static void awaitLockHeld(Path lockFile, Process holder) throws Exception {
        long end = System.nanoTime() + Duration.ofSeconds(60).toNanos();
        while (System.nanoTime() < end) {
            if (!holder.isAlive()) {
                throw new AssertionError("holder ended: " + new String(holder.getInputStream().readAllBytes()));
            }
            if (Files.exists(lockFile) && Files.readString(lockFile).startsWith("pid " + holder.pid())) {
                return;
            }
            Thread.sleep(20);
        }
        throw new AssertionError("the child did not lock the folder within 60 s");
    }

    @Test
    void twoResumesAtOnceInOneProcessWriteEveryPointOnce() throws Exception {
        Path out = dir.resolve("twice");
        Map<Integer, PointRow> all = unfinished(out, 3);
        Sims.Result[] results = new Sims.Result[2];
        Thread a = new Thread(() -> results[0] = resume(out));
        Thread b = new Thread(() -> results[1] = resume(out));
        a.start();
        b.start();
        a.join();
        b.join();
        int refused = 0;
        for (Sims.Result r : results) {
            if (r.code() == 2) {
                refused++;
                assertTrue(r.err().contains("in use by another zweep run"), r.err());
            } else {
                assertEquals(0, r.code(), r.out() + r.err());
            }
        }
        // the second may start after the first has finished (then it finds the run complete)
        assertTrue(refused <= 1, "at most one refused");
        assertSamePoints(all, out);
    }

    @Test
    void resumeRefusesASequenceCopyChangedSinceTheRunStarted() throws Exception {
        Path out = dir.resolve("edited");
        unfinished(out, 10);
        Path copy = out.resolve("sequence.yaml");
        Files.writeString(copy, Files.readString(copy).replace("name:", "# edited\nname:"));
        Sims.Result r = resume(out);
        assertEquals(2, r.code(), r.out() + r.err());
        assertTrue(r.err().contains(copy + ": changed since the run started (SHA-256 "), r.err());
        assertEquals(11, Files.readAllLines(out.resolve("points.csv")).size(), "nothing measured");
    }

    @Test
    void repeatedPointIndexInPointsCsvIsRefusedByResumeAndAnalyzeNamingTheLine() throws Exception {
        Path out = dir.resolve("repeated");
        unfinished(out, 10);
        Path csv = out.resolve("points.csv");
        List<String> lines = new ArrayList<>(Files.readAllLines(csv));
        lines.add(lines.get(4)); // line 5 (point 3) again, as line 12
        Files.write(csv, lines);
        Sims.Result r = resume(out);
        assertEquals(2, r.code(), r.out() + r.err());
        assertTrue(r.err().contains(csv + ":12: point 3 repeats line 5"), r.err());
        Sims.Result a = Sims.zweep("analyze", out.toString());
        assertEquals(2, a.code(), a.out() + a.err());
        assertTrue(a.err().contains(csv + ":12: point 3 repeats line 5"), a.err());
    }

    @Test
    void runStoppedBySigtermBeforeItsFirstPointLeavesAFolderThatResumeCompletes() throws Exception {
        Path ref = dir.resolve("reference");
        assertEquals(0, run(ref).code());
        Path out = dir.resolve("early");
        // the meter accepts the connection and never answers: the run waits for *IDN? when stopped
        try (ServerSocket silent = new ServerSocket(0)) {
            List<Socket> held = new ArrayList<>();
            Thread acceptor = new Thread(() -> {
                try {
                    while (true) {
                        held.add(silent.accept());
                    }
                } catch (IOException e) {
                    // closed
                }
            });
            acceptor.start();
            Process p = child("run", SEQ.toString(), "--meter", "sim:tcp://127.0.0.1:" + silent.getLocalPort(),
                    "--dialect", Sims.dialect(), "--out", out.toString(), "--seed", "5", "--timeout", "60", "--quiet");
            awaitLockHeld(out.resolve(FolderLock.FILE), p);
            long end = System.nanoTime() + Duration.ofSeconds(30).toNanos();
            while (held.isEmpty() && System.nanoTime() < end) {
                Thread.sleep(10);
            }
            p.destroy(); // SIGTERM
            assertTrue(p.waitFor(30, TimeUnit.SECONDS), "child ended");
            for (Socket s : held) {
                s.close();
            }
        }
        assertTrue(Files.isRegularFile(out.resolve("run.json")), "run.json written before the meter is reached");
        assertEquals(SEQ.toAbsolutePath().toString(), RunManifest.read(out.resolve("run.json")).sequence().file());
        Sims.Result r = resume(out);
        assertEquals(0, r.code(), r.out() + r.err());
        assertSamePoints(Rows.of(ref), out);
    }

    @Test
    void writeFailureDuringCompensationNamesTheFileAndLeavesAFolderThatResumeCompletes() throws Exception {
        Path out = dir.resolve("compensation-failed");
        Map<Integer, PointRow> all = unfinished(out, 0);
        Path comp = out.resolve("compensation");
        try (var files = Files.list(comp)) {
            for (Path p : files.toList()) {
                Files.delete(p);
            }
        }
        // host.json (written with host.csv) cannot be written: a non-empty folder stands where it goes (a full disk, as seen
        // from the program: the write fails part-way through compensation)
        Path obstacle = comp.resolve("host.json");
        Files.createDirectories(obstacle.resolve("x"));
        Sims.Result failed = resume(out);
        assertEquals(3, failed.code(), failed.out() + failed.err());
        assertTrue(failed.err().contains("cannot write " + obstacle), failed.err());
        assertTrue(failed.err().contains("zweep run --resume " + out) || failed.err().lines().count() == 1,
                failed.err());
        assertFalse(failed.err().contains("internal error"), failed.err());
        assertEquals("failed", RunManifest.read(out.resolve("run.json")).outcome());
        Files.delete(obstacle.resolve("x"));
        Files.delete(obstacle);
        Sims.Result r = resume(out);
        assertEquals(0, r.code(), r.out() + r.err());
        assertSamePoints(all, out);
    }

    @Test
    void pointsCsvThatCannotGrowMidRunStopsWithExit3NamingItKeepsItsRowsAndResumeCompletes() throws Exception {
        Map<Integer, PointRow> all = Rows.of(completed(dir.resolve("reference")));
        Path out = dir.resolve("file-limit");
        // the child may write files of at most 16 KiB (RLIMIT_FSIZE): points.csv's writes fail part-way
        // through the run with EFBIG, as they would on a full disk; rows are handed over and synced
        // on another thread, and the failure must still stop the run
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder("bash", "-c", "ulimit -f 16 && exec \"$@\"", "zweep",
                "env", "--default-signal=INT,TERM", java, "-cp", System.getProperty("java.class.path"),
                "org.zweep.runner.cli.Main", "run", SEQ.toString(), "--meter", sim(), "--dialect", Sims.dialect(),
                "--out", out.toString(), "--seed", "5", "--quiet");
        pb.redirectErrorStream(true);
        Process p = pb.start();
        String text = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(p.waitFor(120, TimeUnit.SECONDS));
        assertEquals(3, p.exitValue(), text);
        assertTrue(text.contains("cannot write " + out.resolve("points.csv")), text);
        assertFalse(text.contains("internal error"), text);
        assertEquals("failed", RunManifest.read(out.resolve("run.json")).outcome());
        int kept = Rows.of(out).size();
        assertTrue(kept > 0 && kept < all.size(), kept + " of " + all.size() + " rows kept");
        Sims.Result r = resume(out);
        assertEquals(0, r.code(), r.out() + r.err());
        assertSamePoints(all, out);
    }

    Path completed(Path out) {
        Sims.Result r = run(out);
        assertEquals(0, r.code(), r.out() + r.err());
        return out;
    }

    @Test
    void outThatCannotBeCreatedExits2NamingTheFolder() throws Exception {
        Path file = dir.resolve("a-file");
        Files.writeString(file, "not a folder");
        Path out = file.resolve("run");
        Sims.Result r = run(out);
        assertEquals(2, r.code(), r.out() + r.err());
        assertTrue(r.err().startsWith("zweep: cannot create run folder " + out + ": "), r.err());
        assertEquals(1, r.err().lines().count(), r.err());
    }

    @Test
    void runJsonWithoutMeterIsRefusedWithOneClearLine() throws Exception {
        Path out = dir.resolve("no-meter");
        unfinished(out, 10);
        Path json = out.resolve("run.json");
        Files.writeString(json, Files.readString(json).replaceFirst("\"meter\" : \\{[^}]*\\},", ""));
        assertFalse(Files.readString(json).contains("\"meter\""), Files.readString(json));
        Sims.Result r = Sims.zweep("run", "--resume", out.toString(), "--quiet");
        assertEquals(2, r.code(), r.out() + r.err());
        assertEquals("zweep: " + json + ": not a valid run manifest: \"meter\" is missing (a run folder's run.json"
                + " records it when the run starts); cannot resume", r.err().strip());
    }

    @Test
    void lockRecordsWhoHoldsTheFolder() {
        Instant t = Instant.parse("2026-01-02T03:04:05Z");
        try (FolderLock l = FolderLock.acquire(dir, t)) {
            String s = Files.readString(dir.resolve(FolderLock.FILE)).strip();
            assertTrue(s.matches("pid " + ProcessHandle.current().pid() + " on \\S+ since 2026-01-02T03:04:05Z"), s);
        } catch (IOException e) {
            throw new AssertionError(e);
        }
    }
}
