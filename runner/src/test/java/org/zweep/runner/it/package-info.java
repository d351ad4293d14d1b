/**
 * End-to-end checks of the {@code zweep} command line against the simulator over loopback TCP and
 * as child processes: whole runs of the shipped sequences, compensation, fault injection, kill and
 * resume, read back from the run folders they leave.
 */
package org.zweep.runner.it;
