/** Benchmarks of the driver: SCPI query round trips over loopback, client against a bare socket loop. */
package org.zweep.bench.driver;
