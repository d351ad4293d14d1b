/** JMH benchmarks of the analysis: equivalent-circuit fitting. */
package org.zweep.bench.analysis;
