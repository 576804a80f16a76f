/**
 * Use cases: which analyses a command needs and in which order, run through the engine's front doors. The pack
 * ({@link org.isorisk.cli.usecase.PackAnalysis}, producing the {@code notebooks.pack.PackResults} that
 * notebooks-export lays out) and its input, the pack file ({@link org.isorisk.cli.usecase.PackSpecReader}).
 * No arithmetic of its own: every number is an engine result.
 */
package org.isorisk.cli.usecase;
