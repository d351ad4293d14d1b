package org.zweep.runner.analysis;

import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.function.Consumer;
import java.util.function.Function;
import org.zweep.runner.results.PointRow;

/**
 * What the analysis keeps of one step's rows: its sweeps (repeats averaged), the points without
 * a value, the bias sweeps of the part's main value and the spread of repeated points. Made from
 * the rows as they stream by ({@link #read}); a step's rows are folded into running sums and
 * dropped, so a run is analysed in a heap that holds its sweeps, not its rows.
 *
 * @param name the step's name
 * @param index the step's index
 * @param sweeps the step's sweeps, in order of first appearance
 * @param noValue the number of rows without a value
 * @param derating per frequency, level, wiring and bias mode swept over two or more biases: the main
 *     value's sum, count, summed stated variance and summed squared deviation per bias
 * @param repeats the points read more than once
 */
record StepData(String name, int index, List<Sweep> sweeps, long noValue,
        Map<DeratingKey, TreeMap<Double, double[]>> derating, List<RepeatStats> repeats) {

    /**
     * The standard uncertainty of the mean value of one derating entry {sum, n, Σu², Σ(v − mean)²}:
     * the readings' stated variance averaged (a systematic limit, not divided by the number of
     * readings) plus, with two or more readings, the variance of their mean (Type A, JCGM
     * 100:2008, 4.2.3), as for the sweeps' points; NaN when a reading's u is unknown.
     */
    static double deratingU(double[] entry) {
        double n = entry[1];
        double var = entry[2] / n + (n >= 2 ? entry[3] / (n - 1) / n : 0);
        return Math.sqrt(var);
    }

    /** The points of one bias sweep: same frequency, level, wiring and bias mode. */
    record DeratingKey(double frequencyHz, double level, String wiring, String biasMode) {
    }

    /**
     * The steps of {@code run}, each made into a {@code T} by {@code finish} as soon as its rows
     * have gone by (so only one step's running sums are held at a time), in step order, and what
     * was skipped while reading: one pass over {@code points.csv}, a second one only for steps
     * whose rows are not together in the file.
     *
     * @param column the part's main column ({@code cs_f}, {@code ls_h}, {@code rs_ohm}); bias sweeps
     *     are gathered for it unless it is {@code rs_ohm}
     * @param everyRow also given every row, in file order, during the first pass
     */
    static <T> Read<T> read(RunData run, String column, Consumer<PointRow> everyRow, Function<StepData, T> finish) {
        TreeMap<Integer, T> done = new TreeMap<>();
        Set<Integer> scattered = new HashSet<>();
        Collector[] current = {null};
        List<String> notes = run.forEachRow(r -> {
            everyRow.accept(r);
            int i = r.stepIndex();
            if (scattered.contains(i)) {
                return;
            }
            if (current[0] != null && current[0].index == i) {
                current[0].add(r);
                return;
            }
            if (current[0] != null) {
                done.put(current[0].index, finish.apply(current[0].finish()));
                current[0] = null;
            }
            if (done.remove(i) != null) {
                scattered.add(i); // rows of this step come apart in the file: gathered again below
                return;
            }
            current[0] = new Collector(r, column);
            current[0].add(r);
        });
        if (current[0] != null) {
            done.put(current[0].index, finish.apply(current[0].finish()));
        }
        if (!scattered.isEmpty()) {
            Map<Integer, Collector> again = new LinkedHashMap<>();
            run.forEachRow(r -> {
                if (scattered.contains(r.stepIndex())) {
                    again.computeIfAbsent(r.stepIndex(), k -> new Collector(r, column)).add(r);
                }
            });
            again.values().forEach(c -> done.put(c.index, finish.apply(c.finish())));
        }
        return new Read<>(List.copyOf(done.values()), notes);
    }

    /**
     * The steps read and the notes of the reading.
     *
     * @param steps in step order
     * @param notes what was skipped while reading, for people
     */
    record Read<T>(List<T> steps, List<String> notes) {
    }

    /** The running sums of one step. */
    private static final class Collector {
        final String name;
        final int index;
        final String column;
        final Sweep.Collector sweeps;
        long noValue;

        Collector(PointRow first, String column) {
            this.name = first.step();
            this.index = first.stepIndex();
            this.column = column;
            this.sweeps = new Sweep.Collector(column);
        }

        void add(PointRow r) {
            if (!"ok".equals(r.status())) {
                noValue++;
            }
            sweeps.add(r);
        }

        StepData finish() {
            return new StepData(name, index, sweeps.sweeps(), noValue,
                    "rs_ohm".equals(column) ? Map.of() : sweeps.derating(), sweeps.repeats());
        }
    }
}
