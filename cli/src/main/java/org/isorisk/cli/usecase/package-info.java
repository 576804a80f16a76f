/**
 * Use cases: which analyses a command needs and in which order, run through the engine's front doors. The pack
 * ({@link org.isorisk.cli.usecase.PackAnalysis}, producing the {@code notebooks.pack.PackResults} that
 * notebooks-export lays out; its stress runs through {@code PackStress}, which reports a point the solver cannot
 * solve instead of failing the pack) and its input, the pack file ({@link org.isorisk.cli.usecase.PackSpecReader});
 * the one rule for a fund size given beside holdings ({@link org.isorisk.cli.usecase.FundSize}).
 * No arithmetic of its own: every number is an engine result.
 */
package org.isorisk.cli.usecase;
