package org.steamtally.dashboard.security;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class PasswordHashTest {

    @Test
    void theRightPasswordVerifiesAndAWrongOneDoesNot() {
        String stored = PasswordHash.create("feed pump 2".toCharArray(), 1_000);
        assertTrue(PasswordHash.verify("feed pump 2".toCharArray(), stored));
        assertFalse(PasswordHash.verify("feed pump 3".toCharArray(), stored));
    }

    @Test
    void eachHashHasItsOwnSaltAndKeepsItsIterationCount() {
        String a = PasswordHash.create("same".toCharArray(), 1_000);
        String b = PasswordHash.create("same".toCharArray(), 1_000);
        assertNotEquals(a, b);
        assertTrue(a.startsWith("pbkdf2-sha256$1000$"), a);
        assertEquals(4, a.split("\\$").length);
    }

    @Test
    void newHashesUseTheRecommendedIterationCountByDefault() {
        // OWASP Password Storage Cheat Sheet (2023): 600 000 iterations for PBKDF2-HMAC-SHA256.
        assertEquals(600_000, PasswordHash.DEFAULT_ITERATIONS);
    }

    @Test
    void aMalformedStoredHashIsRefusedWithTheExpectedForm() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> PasswordHash.verify("x".toCharArray(), "plain-text-password"));
        assertTrue(e.getMessage().contains("pbkdf2-sha256$<iterations>$<salt>$<hash>"), e.getMessage());
        IllegalArgumentException few = assertThrows(IllegalArgumentException.class,
                () -> PasswordHash.create("x".toCharArray(), 10));
        assertTrue(few.getMessage().contains("was 10"), few.getMessage());
    }
}
