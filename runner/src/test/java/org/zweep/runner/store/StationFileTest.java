package org.zweep.runner.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.InvalidInputException;

class StationFileTest {
    @TempDir
    Path dir;

    @Test
    void readsTheStationNameAndTheDatabase() throws Exception {
        Path f = dir.resolve("station.yaml");
        Files.writeString(f, "# bench 3 in the incoming-inspection lab\nstation: bench-3\n"
                + "database: postgresql://zweep@db.lab:5432/zweep\n");
        StationFile s = StationFile.read(f);
        assertEquals("bench-3", s.station());
        assertEquals("postgresql://zweep@db.lab:5432/zweep", s.database());
    }

    @Test
    void aMissingFileSetsNothing() {
        assertSame(StationFile.NONE, StationFile.read(dir.resolve("none.yaml")));
        assertNull(StationFile.NONE.station());
    }

    @Test
    void theEnvironmentVariableMovesTheFile() {
        assertEquals(Path.of("/tmp/x/station.yaml"), StationFile.location(Map.of(StationFile.ENV, "/tmp/x/station.yaml")));
        assertEquals(StationFile.userFolder().resolve("station.yaml"), StationFile.location(Map.of()));
    }

    @Test
    void anUnknownKeyIsNamedWithItsPlace() throws Exception {
        Path f = dir.resolve("station.yaml");
        Files.writeString(f, "station: bench-3\ndatabse: x.sqlite\n");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> StationFile.read(f));
        assertEquals(f + ":2:1: unknown key 'databse' (a station file has station, database)", e.getMessage());
    }

    @Test
    void aListIsRefusedWithItsPlace() throws Exception {
        Path f = dir.resolve("station.yaml");
        Files.writeString(f, "station: [a, b]\n");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> StationFile.read(f));
        assertEquals(f + ":1:10: station must be a non-empty text", e.getMessage());
    }
}
