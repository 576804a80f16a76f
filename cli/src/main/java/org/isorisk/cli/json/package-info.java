/**
 * The JSON shapes of the machine-readable contract, one per kind of engine value
 * ({@link org.isorisk.cli.json.ResultJson}: solutions, corners, certificates, provenance, risk;
 * {@link org.isorisk.cli.json.RebalanceStressJson}: rebalances and stress runs), and the one way they are printed
 * (Jackson's streaming generator, for start-up time). Field names in {@code snake_case}, numbers in decimals.
 */
package org.isorisk.cli.json;
