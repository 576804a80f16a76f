package org.isorisk.engine.io;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;

/**
 * One input file as read: what it was used for, its name, and the SHA-256 of its bytes, so that a result can
 * say exactly which inputs produced it.
 *
 * @param role   what the file was read as, e.g. {@code expected-returns}, {@code covariance}, {@code holdings}
 * @param path   the path as the user gave it (used in error messages)
 * @param name   the file name alone (used in results, so that outputs carry no machine paths)
 * @param sha256 lower-case hex SHA-256 of the file's bytes (64 characters)
 * @param bytes  file size in bytes
 */
public record SourceFile(String role, String path, String name, String sha256, long bytes) {

    /** Number of hex digits of the short hash shown to people. */
    public static final int SHORT_HASH_LENGTH = 12;

    public SourceFile {
        if (role == null || path == null || name == null || sha256 == null || sha256.length() != 64) {
            throw new IllegalArgumentException("role, path, name and a 64-digit sha256 are required");
        }
    }

    /** The first {@value #SHORT_HASH_LENGTH} hex digits of the SHA-256, enough to tell versions of a file apart. */
    public String shortHash() {
        return sha256.substring(0, SHORT_HASH_LENGTH);
    }

    /** Describes content that did not come from a file (tests, text given in memory). */
    public static SourceFile ofText(String role, String name, String text) {
        byte[] b = text.getBytes(StandardCharsets.UTF_8);
        return new SourceFile(role, name, name, sha256(b), b.length);
    }

    /**
     * Describes a file that was read (e.g. a policy file) from its bytes.
     *
     * @param role  what the file was read as, e.g. {@code policy}
     * @param path  the path as the user gave it
     * @param bytes the file's content (not modified)
     */
    public static SourceFile of(String role, java.nio.file.Path path, byte[] bytes) {
        java.nio.file.Path name = path.getFileName();
        return new SourceFile(role, path.toString(), name == null ? path.toString() : name.toString(), sha256(bytes),
                bytes.length);
    }

    /** Lower-case hex SHA-256 of {@code bytes}. */
    public static String sha256(byte[] bytes) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java runtime provides SHA-256", e);
        }
    }
}
