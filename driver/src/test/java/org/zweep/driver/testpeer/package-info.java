/** Test peers: a scripted meter side over real loopback sockets or pseudo-terminals. */
package org.zweep.driver.testpeer;
