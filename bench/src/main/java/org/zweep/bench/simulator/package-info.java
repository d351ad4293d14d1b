/** JMH benchmarks of the simulator: the netlist solver. */
package org.zweep.bench.simulator;
