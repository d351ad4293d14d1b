package org.zweep.simulator.netlist;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.apache.commons.math3.complex.Complex;
import org.zweep.simulator.SimulatorInputException;

/**
 * A linear one-port given as SPICE element lines between the terminals {@code hi} and {@code lo},
 * and its impedance from modified nodal analysis: 1 A is driven into {@code hi} and out of
 * {@code lo}, and the voltage that results is the impedance.
 *
 * <p>Grammar (see README, section "formats-simulator"): one element per line, {@code R}, {@code L}
 * or {@code C} {@code name node node value}, and {@code K name Lname Lname k} coupling two
 * inductors; {@code *} starts a comment line, {@code +} continues the previous line, {@code ;}
 * separates elements on one line, {@code .end} ends the netlist. Names and nodes are
 * case-insensitive; {@code 0} is another name for {@code lo}. A resistor or inductor of value 0 is
 * a wire. Values use SPICE suffixes ({@link SpiceValue}).
 *
 * <p>Instances are immutable and thread-safe.
 */
public final class Netlist {
    /** The most element lines (R, L, C, K) in one netlist. */
    public static final int MAX_ELEMENTS = 200;
    /** The most distinct nodes, {@code hi} and {@code lo} included. */
    public static final int MAX_NODES = 200;
    /** The longest netlist text, in characters. */
    public static final int MAX_TEXT_CHARS = 1 << 20;

    private final int elementCount;
    private final int size;
    private final int hiIndex;
    private final double[] baseRe;
    private final int[] omegaIndex;
    private final double[] omegaCoef;

    private Netlist(int elementCount, int size, int hiIndex, double[] baseRe, int[] omegaIndex,
            double[] omegaCoef) {
        this.elementCount = elementCount;
        this.size = size;
        this.hiIndex = hiIndex;
        this.baseRe = baseRe;
        this.omegaIndex = omegaIndex;
        this.omegaCoef = omegaCoef;
    }

    /**
     * Parses and checks a netlist whose first line is line 1.
     *
     * @param text the element lines
     * @param sourceName where the text came from, used in messages (a file name, "--device")
     * @throws SimulatorInputException with {@code source:line:column} on a syntax error, a bad
     *     value, a floating node, a dangling element, a short across the terminals or no path
     *     between them
     */
    public static Netlist parse(String text, String sourceName) {
        return parse(text, sourceName, 1);
    }

    /**
     * Parses and checks a netlist embedded in a larger file.
     *
     * @param firstLine the line number (1-based) of the text's first line in {@code sourceName}
     * @see #parse(String, String)
     */
    public static Netlist parse(String text, String sourceName, int firstLine) {
        return parse(text, sourceName, firstLine, 0);
    }

    /**
     * Parses and checks a netlist embedded, indented, in a larger file.
     *
     * @param firstLine the line number (1-based) of the text's first line in {@code sourceName}
     * @param indent how many columns each line of the text is indented by in {@code sourceName}
     * @see #parse(String, String)
     */
    public static Netlist parse(String text, String sourceName, int firstLine, int indent) {
        return new Builder(sourceName)
                .build(NetlistParser.parse(text, sourceName, firstLine, indent));
    }

    /** How many elements (R, L, C and K lines) the netlist has. */
    public int elementCount() {
        return elementCount;
    }

    /**
     * The impedance between {@code hi} and {@code lo}.
     *
     * @param frequencyHz frequency in Hz, greater than 0
     * @return the impedance in ohms
     */
    public Complex impedance(double frequencyHz) {
        double[] re = new double[1];
        double[] im = new double[1];
        impedance(new double[] {frequencyHz}, re, im);
        return new Complex(re[0], im[0]);
    }

    /**
     * The impedance between {@code hi} and {@code lo} at many frequencies, without allocating per
     * frequency.
     *
     * @param frequenciesHz frequencies in Hz, each greater than 0
     * @param realOhm receives the real parts in ohms (at least as long as {@code frequenciesHz})
     * @param imaginaryOhm receives the imaginary parts in ohms
     */
    public void impedance(double[] frequenciesHz, double[] realOhm, double[] imaginaryOhm) {
        int cells = size * size;
        double[] are = new double[cells];
        double[] aim = new double[cells];
        double[] bre = new double[size];
        double[] bim = new double[size];
        for (int f = 0; f < frequenciesHz.length; f++) {
            double omega = 2 * Math.PI * frequenciesHz[f];
            if (!(omega > 0) || Double.isInfinite(omega)) {
                throw new IllegalArgumentException("frequency must be positive and finite: "
                        + frequenciesHz[f] + " Hz");
            }
            if (!solveAt(omega, are, aim, bre, bim)) {
                // Checked when parsed; only an extreme frequency can get here.
                realOhm[f] = Double.NaN;
                imaginaryOhm[f] = Double.NaN;
                continue;
            }
            realOhm[f] = bre[hiIndex];
            imaginaryOhm[f] = bim[hiIndex];
        }
    }

    private boolean solveAt(double omega, double[] are, double[] aim, double[] bre, double[] bim) {
        System.arraycopy(baseRe, 0, are, 0, baseRe.length);
        Arrays.fill(aim, 0);
        for (int i = 0; i < omegaIndex.length; i++) {
            aim[omegaIndex[i]] += omega * omegaCoef[i];
        }
        Arrays.fill(bre, 0);
        Arrays.fill(bim, 0);
        bre[hiIndex] = 1;
        return ComplexLu.solve(size, are, aim, bre, bim);
    }

    /** Checks the parsed elements and assembles the frequency-independent MNA stamps. */
    private static final class Builder {
        private final String source;

        Builder(String source) {
            this.source = source;
        }

        Netlist build(List<NetlistParser.Element> elements) {
            List<NetlistParser.Element> twoTerminal = new ArrayList<>();
            Map<String, NetlistParser.Element> inductors = new HashMap<>();
            List<NetlistParser.Element> couplings = new ArrayList<>();
            for (NetlistParser.Element e : elements) {
                if (e.kind() == 'K') {
                    couplings.add(e);
                } else {
                    twoTerminal.add(e);
                    if (e.kind() == 'L') {
                        inductors.put(e.key(), e);
                    }
                }
            }
            if (twoTerminal.isEmpty()) {
                throw SimulatorInputException.at(source, 1, 0,
                        "the netlist has no R, L or C element between hi and lo");
            }
            Map<String, Integer> nodeIds = new LinkedHashMap<>();
            Map<String, NetlistParser.Element> firstUse = new HashMap<>();
            Map<String, Integer> degree = new HashMap<>();
            for (NetlistParser.Element e : twoTerminal) {
                for (int side = 0; side < 2; side++) {
                    String n = side == 0 ? e.nodeA() : e.nodeB();
                    if (!nodeIds.containsKey(n) && nodeIds.size() == MAX_NODES) {
                        throw SimulatorInputException.at(source, e.line(), e.nodeColumn(side),
                                "more than " + MAX_NODES + " nodes (the limit)");
                    }
                    nodeIds.putIfAbsent(n, nodeIds.size());
                    firstUse.putIfAbsent(n, e);
                    degree.merge(n, 1, Integer::sum);
                }
            }
            for (String terminal : List.of(NetlistParser.HI, NetlistParser.LO)) {
                if (!nodeIds.containsKey(terminal)) {
                    throw SimulatorInputException.at(source, elements.get(0).line(), 0,
                            "no element connects to terminal '" + terminal + "'");
                }
            }
            checkCouplings(couplings, inductors);
            checkWires(twoTerminal, nodeIds);
            for (NetlistParser.Element e : twoTerminal) {
                for (int side = 0; side < 2; side++) {
                    String n = side == 0 ? e.nodeA() : e.nodeB();
                    if (degree.get(n) == 1 && !isTerminal(n)) {
                        throw SimulatorInputException.at(source, e.line(), e.nodeColumn(side),
                                e.name() + " is dangling: node '" + n
                                        + "' connects to nothing else");
                    }
                }
            }
            Set<String> grounded = groundNodes(twoTerminal, couplings, nodeIds, firstUse);
            return assemble(twoTerminal, couplings, inductors, nodeIds, grounded,
                    elements.size());
        }

        private static boolean isTerminal(String node) {
            return node.equals(NetlistParser.HI) || node.equals(NetlistParser.LO);
        }

        private void checkCouplings(List<NetlistParser.Element> couplings,
                Map<String, NetlistParser.Element> inductors) {
            Set<String> pairs = new HashSet<>();
            for (NetlistParser.Element k : couplings) {
                for (int side = 0; side < 2; side++) {
                    String ref = side == 0 ? k.nodeA() : k.nodeB();
                    NetlistParser.Element l = inductors.get(ref);
                    if (l == null) {
                        throw SimulatorInputException.at(source, k.line(), k.nodeColumn(side),
                                k.name() + " couples '" + ref + "', which is not an inductor of"
                                        + " this netlist");
                    }
                    if (l.value() == 0) {
                        throw SimulatorInputException.at(source, k.line(), k.nodeColumn(side),
                                k.name() + " couples " + ref + ", which has the value 0");
                    }
                }
                if (k.nodeA().equals(k.nodeB())) {
                    throw SimulatorInputException.at(source, k.line(), k.nodeColumn(1),
                            k.name() + " couples " + k.nodeA() + " with itself");
                }
                String pair = k.nodeA().compareTo(k.nodeB()) < 0
                        ? k.nodeA() + " " + k.nodeB() : k.nodeB() + " " + k.nodeA();
                if (!pairs.add(pair)) {
                    throw SimulatorInputException.at(source, k.line(), k.column(),
                            k.name() + " couples " + k.nodeA() + " and " + k.nodeB()
                                    + " a second time");
                }
            }
        }

        /** Wires (value 0): neither a loop of wires nor a short from hi to lo. */
        private void checkWires(List<NetlistParser.Element> twoTerminal,
                Map<String, Integer> nodeIds) {
            UnionFind wires = new UnionFind(nodeIds.size());
            int hi = nodeIds.get(NetlistParser.HI);
            int lo = nodeIds.get(NetlistParser.LO);
            for (NetlistParser.Element e : twoTerminal) {
                if (e.value() != 0) {
                    continue;
                }
                int a = nodeIds.get(e.nodeA());
                int b = nodeIds.get(e.nodeB());
                if (wires.find(a) == wires.find(b)) {
                    throw SimulatorInputException.at(source, e.line(), e.column(),
                            e.name() + " closes a loop of zero-value elements");
                }
                wires.union(a, b);
                if (wires.find(hi) == wires.find(lo)) {
                    throw SimulatorInputException.at(source, e.line(), e.column(),
                            e.name() + " shorts the terminals: hi and lo are joined by zero-value"
                                    + " elements");
                }
            }
        }

        /**
         * The reference nodes: {@code lo}, plus one node of every sub-circuit that has no wire to
         * hi or lo but is coupled to them through K (a transformer's isolated winding).
         */
        private Set<String> groundNodes(List<NetlistParser.Element> twoTerminal,
                List<NetlistParser.Element> couplings, Map<String, Integer> nodeIds,
                Map<String, NetlistParser.Element> firstUse) {
            UnionFind galvanic = new UnionFind(nodeIds.size());
            Map<String, String> inductorNode = new HashMap<>();
            for (NetlistParser.Element e : twoTerminal) {
                galvanic.union(nodeIds.get(e.nodeA()), nodeIds.get(e.nodeB()));
                if (e.kind() == 'L') {
                    inductorNode.put(e.key(), e.nodeA());
                }
            }
            int main = galvanic.find(nodeIds.get(NetlistParser.HI));
            if (galvanic.find(nodeIds.get(NetlistParser.LO)) != main) {
                throw SimulatorInputException.at(source, firstUse.get(NetlistParser.LO).line(), 0,
                        "hi and lo are not connected: the netlist is an open circuit");
            }
            Set<Integer> reached = new HashSet<>();
            reached.add(main);
            boolean grew = true;
            while (grew) {
                grew = false;
                for (NetlistParser.Element k : couplings) {
                    int a = galvanic.find(nodeIds.get(inductorNode.get(k.nodeA())));
                    int b = galvanic.find(nodeIds.get(inductorNode.get(k.nodeB())));
                    if (reached.contains(a) != reached.contains(b)) {
                        reached.add(a);
                        reached.add(b);
                        grew = true;
                    }
                }
            }
            Set<String> grounded = new HashSet<>();
            grounded.add(NetlistParser.LO);
            Set<Integer> seen = new HashSet<>();
            seen.add(main);
            for (Map.Entry<String, Integer> node : nodeIds.entrySet()) {
                int comp = galvanic.find(node.getValue());
                if (!seen.add(comp)) {
                    continue;
                }
                if (!reached.contains(comp)) {
                    NetlistParser.Element e = firstUse.get(node.getKey());
                    throw SimulatorInputException.at(source, e.line(), e.column(),
                            "node '" + node.getKey() + "' is floating: no connection to hi or lo");
                }
                grounded.add(node.getKey());
            }
            return grounded;
        }

        private Netlist assemble(List<NetlistParser.Element> twoTerminal,
                List<NetlistParser.Element> couplings, Map<String, NetlistParser.Element> inductors,
                Map<String, Integer> nodeIds, Set<String> grounded, int elementCount) {
            Map<String, Integer> unknown = new HashMap<>();
            for (String node : nodeIds.keySet()) {
                if (!grounded.contains(node)) {
                    unknown.put(node, unknown.size());
                }
            }
            int nodes = unknown.size();
            Map<String, Integer> branch = new HashMap<>();
            for (NetlistParser.Element e : twoTerminal) {
                if (e.kind() == 'L' || (e.kind() == 'R' && e.value() == 0)) {
                    branch.put(e.key(), nodes + branch.size());
                }
            }
            int n = nodes + branch.size();
            double[] base = new double[n * n];
            List<int[]> idx = new ArrayList<>();
            List<Double> coef = new ArrayList<>();
            for (NetlistParser.Element e : twoTerminal) {
                int a = unknown.getOrDefault(e.nodeA(), -1);
                int b = unknown.getOrDefault(e.nodeB(), -1);
                Integer br = branch.get(e.key());
                if (br != null) {
                    stampIncidence(base, n, a, b, br);
                    if (e.kind() == 'L') {
                        idx.add(new int[] {br * n + br});
                        coef.add(-e.value());
                    }
                } else if (e.kind() == 'R') {
                    stampAdmittance(base, n, a, b, 1 / e.value());
                } else {
                    stampOmegaAdmittance(idx, coef, n, a, b, e.value());
                }
            }
            for (NetlistParser.Element k : couplings) {
                NetlistParser.Element l1 = inductors.get(k.nodeA());
                NetlistParser.Element l2 = inductors.get(k.nodeB());
                double m = k.value() * Math.sqrt(l1.value() * l2.value());
                int b1 = branch.get(l1.key());
                int b2 = branch.get(l2.key());
                idx.add(new int[] {b1 * n + b2});
                coef.add(-m);
                idx.add(new int[] {b2 * n + b1});
                coef.add(-m);
            }
            int[] omegaIndex = idx.stream().mapToInt(i -> i[0]).toArray();
            double[] omegaCoef = coef.stream().mapToDouble(Double::doubleValue).toArray();
            Netlist netlist = new Netlist(elementCount, n, unknown.get(NetlistParser.HI), base,
                    omegaIndex, omegaCoef);
            for (double probeHz : new double[] {1.0, 1e3, 1e6}) {
                Complex z = netlist.impedance(probeHz);
                if (z.isNaN() || z.isInfinite()) {
                    throw SimulatorInputException.at(source, twoTerminal.get(0).line(), 0,
                            "the circuit has no unique solution at " + probeHz + " Hz");
                }
            }
            return netlist;
        }

        private static void stampIncidence(double[] m, int n, int a, int b, int br) {
            if (a >= 0) {
                m[a * n + br] += 1;
                m[br * n + a] += 1;
            }
            if (b >= 0) {
                m[b * n + br] -= 1;
                m[br * n + b] -= 1;
            }
        }

        private static void stampAdmittance(double[] m, int n, int a, int b, double g) {
            if (a >= 0) {
                m[a * n + a] += g;
            }
            if (b >= 0) {
                m[b * n + b] += g;
            }
            if (a >= 0 && b >= 0) {
                m[a * n + b] -= g;
                m[b * n + a] -= g;
            }
        }

        private static void stampOmegaAdmittance(List<int[]> idx, List<Double> coef, int n, int a,
                int b, double c) {
            if (a >= 0) {
                idx.add(new int[] {a * n + a});
                coef.add(c);
            }
            if (b >= 0) {
                idx.add(new int[] {b * n + b});
                coef.add(c);
            }
            if (a >= 0 && b >= 0) {
                idx.add(new int[] {a * n + b});
                coef.add(-c);
                idx.add(new int[] {b * n + a});
                coef.add(-c);
            }
        }
    }

    /** Disjoint sets over node ids. */
    private static final class UnionFind {
        private final int[] parent;

        UnionFind(int n) {
            parent = new int[n];
            for (int i = 0; i < n; i++) {
                parent[i] = i;
            }
        }

        int find(int x) {
            while (parent[x] != x) {
                parent[x] = parent[parent[x]];
                x = parent[x];
            }
            return x;
        }

        void union(int a, int b) {
            parent[find(a)] = find(b);
        }
    }

    @Override
    public String toString() {
        return String.format(Locale.ROOT, "Netlist[%d elements, %d unknowns]", elementCount, size);
    }
}
