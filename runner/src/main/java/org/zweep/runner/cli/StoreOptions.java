package org.zweep.runner.cli;

import org.zweep.runner.store.Database;
import org.zweep.runner.store.ResultsStore;
import org.zweep.runner.store.StationFile;
import picocli.CommandLine.Option;

/** The {@code --db} option of the commands that use the results index. */
final class StoreOptions {
    @Option(names = "--db", paramLabel = "DB",
            description = "the results index: a SQLite file or postgresql://[USER[:PASSWORD]@]HOST[:PORT]/NAME"
                    + " (default: database: in the station file, else index.sqlite beside it, ~/.zweep/index.sqlite)")
    String db;

    /** The database chosen by {@code --db}, the station file or the default. */
    Database database() {
        return Database.choose(db, StationFile.load(), System.getenv());
    }

    /** Opens the chosen index (creating or upgrading its schema). */
    ResultsStore open() {
        return ResultsStore.open(database());
    }
}
