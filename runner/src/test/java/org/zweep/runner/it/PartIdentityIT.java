package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.RunId;
import org.zweep.runner.results.RunManifest;

/**
 * {@code zweep run} records which part it measured (serial, lot, operator, station from the
 * option or the station file), a run id, and where its compensation came from; the CSV export
 * carries the run id, serial, lot and verdict on every row.
 */
class PartIdentityIT {
    @TempDir
    Path dir;

    @Test
    void twoPartsOfALotRecordTheirIdentityAndTheSecondSaysWhoseCompensationItReused() throws Exception {
        Path seq = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");
        String meter = "sim:" + Sims.benchOf(seq) + "?timing=none";
        Path first = dir.resolve("results/part-1");
        Path second = dir.resolve("results/part-2");
        Sims.Result r1 = Sims.zweep("run", seq.toString(), "--meter", meter, "--out", first.toString(), "--quiet",
                "--serial", "SN-0001", "--lot", "L24-17", "--operator", "ana", "--station", "bench-3");
        assertTrue(r1.code() == 0 || r1.code() == 1, r1.err()); // completed: pass or fail

        // the second part on a station named by its station file, in a child JVM (the file comes from the environment)
        Path stationFile = dir.resolve("station.yaml");
        Files.writeString(stationFile, "station: bench-7\ndatabase: " + dir.resolve("index.sqlite") + "\n");
        Path log = dir.resolve("second.log");
        Process p = Children.zweep(log, Map.of("ZWEEP_STATION_FILE", stationFile.toString()), "run", seq.toString(),
                "--meter", meter, "--out", second.toString(), "--quiet", "--serial", "SN-0002", "--lot", "L24-17");
        assertTrue(p.waitFor(120, TimeUnit.SECONDS), "the second run did not end");
        assertTrue(p.exitValue() == 0 || p.exitValue() == 1, Files.readString(log));

        RunManifest m1 = RunManifest.read(first.resolve("run.json"));
        RunManifest m2 = RunManifest.read(second.resolve("run.json"));
        assertEquals(new RunManifest.Identity("SN-0001", "L24-17", "ana", "bench-3"), m1.identity());
        assertEquals(new RunManifest.Identity("SN-0002", "L24-17", null, "bench-7"), m2.identity());

        // ids: version-7 UUIDs, distinct, in the order the runs started
        assertNotEquals(m1.id(), m2.id());
        assertTrue(m1.id().compareTo(m2.id()) < 0, m1.id() + " / " + m2.id());
        Instant started1 = Instant.parse(m1.started());
        assertTrue(Math.abs(RunId.time(m1.id()).toEpochMilli() - started1.toEpochMilli()) < 60_000,
                "the id's time is the run's start");

        // compensation: measured by the first run, reused (from the first folder, with its time) by the second
        assertEquals("measured", m1.compensation().source());
        assertNull(m1.compensation().reusedFrom());
        assertEquals("reused", m2.compensation().source());
        assertEquals(first.resolve("compensation/host.csv").toAbsolutePath().normalize().toString(),
                m2.compensation().reusedFrom());
        assertEquals(m1.compensation().measuredAt(), m2.compensation().measuredAt());
        assertTrue(Instant.parse(m1.compensation().measuredAt()).isBefore(Instant.parse(m2.started())));

        // the CSV export: the same run id, serial, lot and verdict on every row
        Sims.Result e = Sims.zweep("export", second.toString(), "--format", "csv");
        assertEquals(0, e.code(), e.err());
        List<String> lines = Files.readAllLines(second.resolve("export.csv"));
        List<String> header = List.of(lines.get(0).split(","));
        for (String line : lines.subList(1, lines.size())) {
            List<String> cells = List.of(line.split(",", -1));
            assertEquals(m2.id(), cells.get(header.indexOf("run_id")));
            assertEquals("SN-0002", cells.get(header.indexOf("serial")));
            assertEquals("L24-17", cells.get(header.indexOf("lot")));
            assertEquals(m2.verdict(), cells.get(header.indexOf("verdict")));
        }
        assertTrue(lines.size() > 10);

        // the Touchstone export names the part in its comments
        Path ts = dir.resolve("ts");
        Sims.Result t = Sims.zweep("export", second.toString(), "--format", "touchstone", "--out", ts.toString());
        assertEquals(0, t.code(), t.err());
        try (var files = Files.list(ts)) {
            for (Path f : files.toList()) {
                assertTrue(Files.readAllLines(f).contains("! serial: SN-0002, lot: L24-17"), f.toString());
            }
        }
    }

    @Test
    void identityOptionsAreRefusedOnResume() {
        Sims.Result r = Sims.zweep("run", "--resume", dir.toString(), "--serial", "SN-1");
        assertEquals(2, r.code());
        assertTrue(r.err().contains("--serial, --lot, --operator and --station cannot be used with --resume"), r.err());
    }
}
