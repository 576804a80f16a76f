package org.isorisk.engine.book;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;

/**
 * The ids seen so far and the row each was first seen on, exactly (no false duplicates), in compact form: an
 * open-addressing table of 64-bit hashes with the row and the id's UTF-8 bytes in one growing array, about
 * 32 bytes per id plus its characters, so that a million portfolios need tens of megabytes, not hundreds.
 * Not thread-safe.
 */
final class IdIndex {
    private long[] hashes = new long[1024];
    private int[] offsets = new int[1024];
    private int[] rows = new int[1024];
    private byte[] bytes = new byte[16 * 1024];
    private int used;
    private int size;

    /**
     * Records {@code id} as seen on {@code row} unless it was seen before.
     *
     * @return 0 when the id is new, else the row it was first seen on
     */
    int firstRow(String id, int row) {
        byte[] b = id.getBytes(StandardCharsets.UTF_8);
        long h = hash(b);
        int mask = hashes.length - 1;
        for (int slot = (int) (h ^ (h >>> 32)) & mask; ; slot = (slot + 1) & mask) {
            if (hashes[slot] == 0) {
                if (2 * (size + 1) > hashes.length) {
                    grow();
                    return firstRow(id, row);
                }
                hashes[slot] = h;
                rows[slot] = row;
                offsets[slot] = store(b);
                size++;
                return 0;
            }
            if (hashes[slot] == h && same(offsets[slot], b)) {
                return rows[slot];
            }
        }
    }

    /** Ids recorded. */
    int size() {
        return size;
    }

    private int store(byte[] b) {
        int need = used + 4 + b.length;
        if (need > bytes.length) {
            bytes = Arrays.copyOf(bytes, Math.max(need, bytes.length * 2));
        }
        int at = used;
        bytes[at] = (byte) (b.length >>> 24);
        bytes[at + 1] = (byte) (b.length >>> 16);
        bytes[at + 2] = (byte) (b.length >>> 8);
        bytes[at + 3] = (byte) b.length;
        System.arraycopy(b, 0, bytes, at + 4, b.length);
        used = need;
        return at;
    }

    private boolean same(int at, byte[] b) {
        int len = ((bytes[at] & 0xFF) << 24) | ((bytes[at + 1] & 0xFF) << 16) | ((bytes[at + 2] & 0xFF) << 8)
                | (bytes[at + 3] & 0xFF);
        return len == b.length && Arrays.equals(bytes, at + 4, at + 4 + len, b, 0, len);
    }

    private void grow() {
        long[] oh = hashes;
        int[] oo = offsets;
        int[] or = rows;
        hashes = new long[oh.length * 2];
        offsets = new int[oh.length * 2];
        rows = new int[oh.length * 2];
        int mask = hashes.length - 1;
        for (int k = 0; k < oh.length; k++) {
            if (oh[k] != 0) {
                int slot = (int) (oh[k] ^ (oh[k] >>> 32)) & mask;
                while (hashes[slot] != 0) {
                    slot = (slot + 1) & mask;
                }
                hashes[slot] = oh[k];
                offsets[slot] = oo[k];
                rows[slot] = or[k];
            }
        }
    }

    /** FNV-1a over the bytes, then the SplitMix64 finaliser to spread it; never 0 (0 marks an empty slot). */
    static long hash(byte[] b) {
        long h = 0xcbf29ce484222325L;
        for (byte x : b) {
            h = (h ^ (x & 0xFF)) * 0x100000001b3L;
        }
        h = (h ^ (h >>> 30)) * 0xbf58476d1ce4e5b9L;
        h = (h ^ (h >>> 27)) * 0x94d049bb133111ebL;
        h ^= h >>> 31;
        return h == 0 ? 1 : h;
    }
}
