package org.steamtally.dashboard.security;

import java.security.GeneralSecurityException;
import java.security.MessageDigest;
import java.security.SecureRandom;
import java.util.Base64;
import javax.crypto.SecretKeyFactory;
import javax.crypto.spec.PBEKeySpec;

/**
 * Password hashes with PBKDF2-HMAC-SHA256 (RFC 8018, section 5.2) from the JDK, stored as one string
 * {@code pbkdf2-sha256$<iterations>$<salt, base64>$<hash, base64>} so that the iteration count can
 * be raised later without invalidating stored hashes.
 */
public final class PasswordHash {

    /**
     * Iterations for new hashes: OWASP Password Storage Cheat Sheet (2023) recommends 600 000 for
     * PBKDF2-HMAC-SHA256. About a quarter of a second per login on a small server, which is the point.
     */
    public static final int DEFAULT_ITERATIONS = 600_000;

    /** The fewest iterations a stored hash may have; lower is accepted only by {@link #create(char[], int)} for tests. */
    private static final int MIN_ITERATIONS = 1_000;

    private static final String PREFIX = "pbkdf2-sha256";
    private static final int SALT_BYTES = 16;
    private static final int HASH_BITS = 256;
    private static final SecureRandom RANDOM = new SecureRandom();

    private PasswordHash() {
    }

    /** A new hash of {@code password} with a random salt and {@link #DEFAULT_ITERATIONS}. */
    public static String create(char[] password) {
        return create(password, DEFAULT_ITERATIONS);
    }

    /** A new hash with the given iteration count, at least 1000. */
    public static String create(char[] password, int iterations) {
        if (iterations < MIN_ITERATIONS) {
            throw new IllegalArgumentException("iterations must be at least " + MIN_ITERATIONS + ", was " + iterations);
        }
        byte[] salt = new byte[SALT_BYTES];
        RANDOM.nextBytes(salt);
        Base64.Encoder b64 = Base64.getEncoder().withoutPadding();
        return PREFIX + "$" + iterations + "$" + b64.encodeToString(salt) + "$" + b64.encodeToString(derive(password, salt, iterations));
    }

    /**
     * Whether {@code password} matches {@code stored}, compared in constant time.
     *
     * @throws IllegalArgumentException if {@code stored} is not a hash of this form
     */
    public static boolean verify(char[] password, String stored) {
        String[] parts = stored.split("\\$");
        if (parts.length != 4 || !parts[0].equals(PREFIX)) {
            throw new IllegalArgumentException("a stored password hash must look like " + PREFIX
                    + "$<iterations>$<salt>$<hash>");
        }
        int iterations;
        try {
            iterations = Integer.parseInt(parts[1]);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("iteration count of a stored password hash is not a number: " + parts[1]);
        }
        if (iterations < MIN_ITERATIONS) {
            throw new IllegalArgumentException("stored password hash has " + iterations + " iterations, fewer than "
                    + MIN_ITERATIONS);
        }
        byte[] salt = Base64.getDecoder().decode(parts[2]);
        byte[] expected = Base64.getDecoder().decode(parts[3]);
        return MessageDigest.isEqual(expected, derive(password, salt, iterations));
    }

    private static byte[] derive(char[] password, byte[] salt, int iterations) {
        PBEKeySpec spec = new PBEKeySpec(password, salt, iterations, HASH_BITS);
        try {
            return SecretKeyFactory.getInstance("PBKDF2WithHmacSHA256").generateSecret(spec).getEncoded();
        } catch (GeneralSecurityException e) {
            throw new IllegalStateException("the JDK lacks PBKDF2WithHmacSHA256", e);
        } finally {
            spec.clearPassword();
        }
    }
}
