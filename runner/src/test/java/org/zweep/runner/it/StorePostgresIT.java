package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.store.Database;
import org.zweep.runner.store.ResultsStore;
import org.zweep.runner.testsupport.PostgresServer;

/**
 * The results index on a real PostgreSQL server started by the test: runs index into it from
 * {@code zweep run --db postgresql://...}, and four station processes, each pointed at the server by
 * its own station file, index their runs at the same time (every process also re-indexes the runs
 * all stations share). Afterwards the server holds exactly what the folders say, row for row the
 * same as a SQLite index rebuilt from the same folders.
 */
class StorePostgresIT {
    @TempDir
    Path dir;

    @Test
    void fourStationsIndexingAtOnceGiveExactlyTheFoldersAndTheSameTablesAsSqlite() throws Exception {
        try (PostgresServer pg = PostgresServer.start()) {
            String url = pg.createDatabase("lab");
            Path results = dir.resolve("results");
            List<Path> shared = new ArrayList<>();
            for (int i = 1; i <= 2; i++) {
                Path out = results.resolve("shared/measured-" + i);
                Sims.Result r = StoreFolders.measure(out, 200 + i, "SN-P" + i, "L-P", url);
                assertEquals(0, r.code(), r.err());
                assertTrue(r.out().contains("indexed in: jdbc:postgresql://127.0.0.1:"), r.out());
                shared.add(out);
            }
            List<Path> all = new ArrayList<>(shared);
            for (int station = 1; station <= 4; station++) {
                for (int k = 0; k < 8; k++) {
                    Path out = results.resolve("bench-" + station + "/run-" + k);
                    StoreFolders.copyAs(shared.get(k % 2), out, station * 100 + k, "SN-" + station + "-" + k,
                            "L-" + (k % 2 == 0 ? "X" : "Y"), "bench-" + station, k == 3 ? "fail" : "pass");
                    all.add(out);
                }
            }
            List<Process> stations = new ArrayList<>();
            for (int station = 1; station <= 4; station++) {
                Path file = dir.resolve("station-" + station + ".yaml");
                Files.writeString(file, "station: bench-" + station + "\ndatabase: " + url + "\n");
                stations.add(Children.zweep(dir.resolve("station-" + station + ".log"),
                        Map.of("ZWEEP_STATION_FILE", file.toString()), "index", "--quiet",
                        results.resolve("bench-" + station).toString(), results.resolve("shared").toString()));
            }
            for (int i = 0; i < stations.size(); i++) {
                assertTrue(stations.get(i).waitFor(180, TimeUnit.SECONDS), "station " + (i + 1) + " did not end");
                assertEquals(0, stations.get(i).exitValue(),
                        Files.readString(dir.resolve("station-" + (i + 1) + ".log")));
            }

            Map<String, List<String>> server;
            try (ResultsStore s = ResultsStore.open(Database.parse(url, "test"))) {
                server = s.contents();
            }
            int points = 0;
            int checks = 0;
            for (Path f : all) {
                points += StoreFolders.points(f);
                checks += RunManifest.read(f.resolve("run.json")).checks().size();
            }
            assertEquals(all.size(), server.get("runs").size(), "runs");
            assertEquals(points, server.get("points").size(), "points");
            assertEquals(checks, server.get("checks").size(), "checks");
            assertEquals(all.size(), server.get("parts").size(), "parts (one serial each)");
            assertEquals(3, server.get("lots").size(), "lots L-P, L-X, L-Y");
            assertEquals(4, server.get("stations").size(), "stations bench-1 ... bench-4 (the measured runs are on bench-1)");

            Path sqlite = dir.resolve("rebuilt.sqlite");
            List<String> args = new ArrayList<>(List.of("index", "--quiet", "--db", sqlite.toString()));
            all.forEach(p -> args.add(p.toString()));
            assertEquals(0, Sims.zweep(args.toArray(String[]::new)).code());
            try (ResultsStore s = ResultsStore.open(Database.sqlite(sqlite))) {
                assertEquals(s.contents(), server);
            }

            // the questions work the same against the server
            Sims.Result runs = Sims.zweep("runs", "--db", url, "--verdict", "fail");
            assertEquals(0, runs.code(), runs.err());
            assertTrue(runs.out().strip().endsWith("4 runs"), runs.out());
        }
    }
}
