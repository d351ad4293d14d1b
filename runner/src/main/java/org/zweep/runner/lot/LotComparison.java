package org.zweep.runner.lot;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.zweep.runner.store.Capability;

/**
 * Two or more lots side by side: per check, each lot's number of parts, passes, mean, σ (n − 1),
 * lowest and highest value and Cpk, with each mean's difference from the first lot's (the
 * reference) and the relative change. Values are SI; {@code NaN} where a lot has no such check.
 *
 * @param lots the lots, the reference first
 * @param checks one row per check met in any lot, in the order first met
 */
public record LotComparison(List<Lot> lots, List<Row> checks) {

    /**
     * One lot compared.
     *
     * @param folder its folder
     * @param table its parts
     */
    public record Lot(Path folder, LotTable table) {
    }

    /**
     * One check across the lots; each list has one entry per lot ({@code null} where the lot has no such check).
     *
     * @param name the check's name
     * @param parameter its parameter
     * @param stats each lot's statistics, or null
     */
    public record Row(String name, String parameter, List<LotTable.CheckStats> stats) {
        /** Lot {@code i}'s capability figures, or a row of NaN. */
        public Capability capability(int i) {
            LotTable.CheckStats s = stats.get(i);
            return s == null ? new Capability(0, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN)
                    : s.capability();
        }

        /** Lot {@code i}'s mean minus the reference's. */
        public double meanDifference(int i) {
            return capability(i).mean() - capability(0).mean();
        }

        /** The difference relative to the reference's mean ({@code NaN} when that is 0). */
        public double meanRelative(int i) {
            double ref = capability(0).mean();
            return ref == 0 ? Double.NaN : meanDifference(i) / Math.abs(ref);
        }
    }

    /** Reads the lots in {@code folders} (at least two) and compares them. */
    public static LotComparison of(List<Path> folders) {
        List<Lot> lots = new ArrayList<>();
        for (Path f : folders) {
            lots.add(new Lot(f, LotTable.read(f)));
        }
        Map<String, Row> rows = new LinkedHashMap<>();
        for (int i = 0; i < lots.size(); i++) {
            for (LotTable.CheckStats s : lots.get(i).table().checkStats()) {
                Row row = rows.computeIfAbsent(s.name(), n -> {
                    List<LotTable.CheckStats> empty = new ArrayList<>();
                    for (int j = 0; j < lots.size(); j++) {
                        empty.add(null);
                    }
                    return new Row(n, s.parameter(), empty);
                });
                row.stats().set(i, s);
            }
        }
        return new LotComparison(List.copyOf(lots), List.copyOf(rows.values()));
    }
}
