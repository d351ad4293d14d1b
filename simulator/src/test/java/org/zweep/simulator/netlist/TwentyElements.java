package org.zweep.simulator.netlist;

/** A 20-element network (a lossy LC ladder with a coupled pair) shared by tests. */
final class TwentyElements {

    static final String NETLIST = String.join("\n",
            "* 20 elements: ladder with losses and a coupled pair",
            "R1 hi n1 0.1",
            "L1 n1 n2 1u",
            "C1 n2 0 1n",
            "R2 n2 0 10k",
            "L2 n2 n3 2u",
            "C2 n3 0 2n",
            "R3 n3 n4 1",
            "L3 n4 n5 1u",
            "C3 n5 0 1n",
            "R4 n5 0 5k",
            "L4 n5 n6 3u",
            "C4 n6 0 500p",
            "R5 n6 n7 0.5",
            "L5 n7 0 10u",
            "L6 s 0 10u",
            "R6 s 0 50",
            "K1 L5 L6 0.9",
            "C5 n7 0 100p",
            "C6 hi 0 10p",
            "R7 n4 0 100k",
            "");

    private TwentyElements() {
    }
}
