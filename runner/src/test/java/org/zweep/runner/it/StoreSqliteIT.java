package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.store.Database;
import org.zweep.runner.store.ResultsStore;

/**
 * The results index in its embedded default, SQLite: {@code zweep run} indexes its run, {@code zweep
 * index} adds folders, indexing again changes nothing, a rebuild from the folders gives the same
 * tables, and four processes indexing at once lose and duplicate nothing.
 */
class StoreSqliteIT {
    @TempDir
    static Path dir;
    static Path results;
    static List<Path> folders = new ArrayList<>();

    @BeforeAll
    static void measureAndCopy() {
        results = dir.resolve("results");
        // two real runs, indexed by zweep run itself
        Path db = dir.resolve("by-run.sqlite");
        for (int i = 1; i <= 2; i++) {
            Path out = results.resolve("measured-" + i);
            Sims.Result r = StoreFolders.measure(out, 100 + i, "SN-M" + i, "L-A", db.toString());
            assertEquals(0, r.code(), r.err());
            assertTrue(r.out().contains("indexed in: " + db.toAbsolutePath()), r.out());
            folders.add(out);
        }
        // and 22 other parts of three lots on three stations, some failing
        for (int i = 0; i < 22; i++) {
            Path out = results.resolve("copy-" + (100 + i));
            StoreFolders.copyAs(folders.get(i % 2), out, i, "SN-" + (1000 + i), "L-" + "ABC".charAt(i % 3),
                    "bench-" + (1 + i % 3), i % 5 == 4 ? "fail" : "pass");
            folders.add(out);
        }
    }

    private Map<String, List<String>> contents(Path sqlite) {
        try (ResultsStore s = ResultsStore.open(Database.sqlite(sqlite))) {
            return s.contents();
        }
    }

    /** What the folders say the index must hold: rows per table. */
    private Map<String, Integer> expectedCounts() {
        int points = 0;
        int checks = 0;
        int steps = 0;
        Set<String> lots = new HashSet<>();
        Set<String> stations = new HashSet<>();
        Set<String> serials = new HashSet<>();
        for (Path f : folders) {
            RunManifest m = RunManifest.read(f.resolve("run.json"));
            points += StoreFolders.points(f);
            checks += m.checks().size();
            steps += m.steps().size();
            lots.add(m.identity().lot());
            stations.add(m.identity().station());
            serials.add(m.identity().serial());
        }
        return Map.of("runs", folders.size(), "points", points, "checks", checks, "steps", steps, "lots", lots.size(),
                "stations", stations.size(), "parts", serials.size());
    }

    private void assertMatchesFolders(Map<String, List<String>> c) {
        expectedCounts().forEach((table, n) -> assertEquals(n, c.get(table).size(), table));
        // every run's identity and verdict as its run.json says
        for (Path f : folders) {
            RunManifest m = RunManifest.read(f.resolve("run.json"));
            long rows = c.get("runs").stream().filter(r -> r.startsWith(m.id() + "|")
                    && r.contains("|" + m.identity().serial() + "|" + m.identity().lot() + "|")
                    && r.contains("|" + m.verdict() + "|")).count();
            assertEquals(1, rows, f + " is in the index once, as its run.json says");
        }
        assertTrue(c.get("fits").size() >= folders.size(), "every run's sweep was fitted");
    }

    @Test
    void runIndexesItsRunAndIndexAddsTheRestOnce() {
        Path db = dir.resolve("by-run.sqlite");
        Map<String, List<String>> before = contents(db);
        assertEquals(2, before.get("runs").size(), "zweep run indexed its two runs");
        Sims.Result r = Sims.zweep("index", results.toString(), "--db", db.toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("24 runs (" + expectedCounts().get("points") + " points) indexed in "), r.out());
        Map<String, List<String>> once = contents(db);
        assertMatchesFolders(once);
        // indexed again: nothing changes
        assertEquals(0, Sims.zweep("index", results.toString(), "--db", db.toString(), "--quiet").code());
        assertEquals(once, contents(db));
    }

    @Test
    void aRebuildFromTheFoldersGivesTheSameTablesInWhateverOrder() {
        Path a = dir.resolve("a.sqlite");
        assertEquals(0, Sims.zweep("index", results.toString(), "--db", a.toString(), "--quiet").code());
        Path b = dir.resolve("b.sqlite");
        List<String> reversed = new ArrayList<>(List.of("index", "--db", b.toString(), "--quiet"));
        for (int i = folders.size() - 1; i >= 0; i--) {
            reversed.add(folders.get(i).toString());
        }
        assertEquals(0, Sims.zweep(reversed.toArray(String[]::new)).code());
        Map<String, List<String>> ca = contents(a);
        assertMatchesFolders(ca);
        assertEquals(ca, contents(b));
    }

    @Test
    void fourProcessesIndexingAtOnceLoseAndDuplicateNothing() throws Exception {
        Path db = dir.resolve("shared.sqlite");
        List<Process> children = new ArrayList<>();
        // each of four station processes indexes every folder (so each run is written four times at once)
        for (int i = 0; i < 4; i++) {
            children.add(Children.zweep(dir.resolve("child-" + i + ".log"), "index", results.toString(), "--db",
                    db.toString(), "--quiet"));
        }
        for (int i = 0; i < 4; i++) {
            Process p = children.get(i);
            assertTrue(p.waitFor(180, TimeUnit.SECONDS), "child " + i + " did not end");
            assertEquals(0, p.exitValue(), Files.readString(dir.resolve("child-" + i + ".log")));
        }
        Path reference = dir.resolve("reference.sqlite");
        assertEquals(0, Sims.zweep("index", results.toString(), "--db", reference.toString(), "--quiet").code());
        Map<String, List<String>> shared = contents(db);
        assertMatchesFolders(shared);
        assertEquals(contents(reference), shared);
    }

    @Test
    void runsListsByLotAndVerdict() throws Exception {
        Path db = dir.resolve("list.sqlite");
        assertEquals(0, Sims.zweep("index", results.toString(), "--db", db.toString(), "--quiet").code());
        Sims.Result r = Sims.zweep("runs", "--db", db.toString(), "--lot", "L-B", "--verdict", "fail", "--json");
        assertEquals(0, r.code(), r.err());
        JsonNode list = new ObjectMapper().readTree(r.out());
        // copies i = 0..21 with i % 3 == 1 (lot L-B) and i % 5 == 4 (fail): i = 4, 19
        List<String> serials = new ArrayList<>();
        list.forEach(n -> serials.add(n.get("serial").asText()));
        assertEquals(List.of("SN-1004", "SN-1019"), serials);
        Sims.Result since = Sims.zweep("runs", "--db", db.toString(), "--since", "2026-11-02T08:20:00Z", "--part",
                "KP-C0805-104");
        assertEquals(0, since.code(), since.err());
        // copies 20 and 21 started at 08:20 and 08:21; the measured runs started today
        assertTrue(since.out().contains("SN-1020") && since.out().contains("SN-1021")
                && !since.out().contains("SN-1019"), since.out());
        assertTrue(since.out().strip().endsWith("4 runs"), since.out());
    }

    @Test
    void aDatabaseThatCannotBeWrittenOnlyWarnsAndTheRunIsKept() throws Exception {
        // a folder where the database file should be: SQLite cannot open it (a missing folder is refused
        // before the run, see DatabaseTest; this one is only found out when the run is indexed)
        Path blocker = Files.createDirectories(dir.resolve("index-is-a-folder.sqlite"));
        Path out = dir.resolve("kept");
        Sims.Result r = StoreFolders.measure(out, 7, "SN-K", "L-K", blocker.toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(r.err().contains("WARNING: the run was not indexed"), r.err());
        assertTrue(r.err().contains("'zweep index " + out + "' adds it later"), r.err());
        assertEquals("completed", RunManifest.read(out.resolve("run.json")).outcome());
        assertEquals(66, StoreFolders.points(out));
    }
}
