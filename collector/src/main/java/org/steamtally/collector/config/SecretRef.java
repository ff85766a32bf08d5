package org.steamtally.collector.config;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Objects;
import java.util.function.UnaryOperator;

/**
 * Where a secret (a user name, password or key-store password) is kept: the name of an environment
 * variable or the path of a file. The plant description names the place, never the secret, and
 * {@link #toString()} shows only the place, so that logging a settings record leaks nothing.
 *
 * @param kind where to look
 * @param name the variable's name or the file's path
 */
public record SecretRef(Kind kind, String name) {

    /** Where a secret is read from. */
    public enum Kind {
        /** An environment variable. */
        ENV,
        /** A file whose whole content, less one trailing line break, is the secret. */
        FILE
    }

    public SecretRef {
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(name, "name");
        if (name.isBlank()) {
            throw new IllegalArgumentException("a secret's " + (kind == Kind.ENV ? "variable name" : "file path")
                    + " must not be blank");
        }
    }

    /** A secret in the environment variable {@code variable}. */
    public static SecretRef env(String variable) {
        return new SecretRef(Kind.ENV, variable);
    }

    /** A secret in the file at {@code path}. */
    public static SecretRef file(String path) {
        return new SecretRef(Kind.FILE, path);
    }

    /**
     * Reads the secret.
     *
     * @param environment looks up an environment variable ({@code System::getenv} outside tests)
     * @return the secret as characters, so that a caller can clear it after use
     * @throws IllegalStateException naming the place (never the content) when the secret is missing or empty
     */
    public char[] resolve(UnaryOperator<String> environment) {
        String value;
        if (kind == Kind.ENV) {
            value = environment.apply(name);
            if (value == null || value.isEmpty()) {
                throw new IllegalStateException("environment variable " + name + " is not set or empty");
            }
        } else {
            try {
                value = Files.readString(Path.of(name), StandardCharsets.UTF_8);
            } catch (IOException | RuntimeException e) {
                throw new IllegalStateException("secret file " + name + " cannot be read ("
                        + e.getClass().getSimpleName() + ")");
            }
            if (value.endsWith("\n")) {
                value = value.substring(0, value.length() - 1);
            }
            if (value.endsWith("\r")) {
                value = value.substring(0, value.length() - 1);
            }
            if (value.isEmpty()) {
                throw new IllegalStateException("secret file " + name + " is empty");
            }
        }
        return value.toCharArray();
    }

    @Override
    public String toString() {
        return (kind == Kind.ENV ? "env:" : "file:") + name;
    }
}
