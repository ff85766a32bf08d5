package org.steamtally.collector.mqtt;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.GeneralSecurityException;
import java.security.KeyStore;
import java.util.Arrays;
import java.util.Optional;
import java.util.function.UnaryOperator;
import javax.net.ssl.KeyManagerFactory;
import javax.net.ssl.SSLContext;
import javax.net.ssl.SSLSocketFactory;
import javax.net.ssl.TrustManagerFactory;
import org.steamtally.collector.config.CollectorSettings;

/** TLS for {@code ssl://} and {@code wss://} brokers from the configured trust and key stores. */
final class TlsSockets {

    private TlsSockets() {
    }

    /**
     * The socket factory the settings ask for; empty when neither a trust store nor a key store is
     * configured (the client then uses the JVM's default trust for TLS URLs).
     *
     * @throws IllegalStateException naming the store (never a password) when one cannot be loaded
     */
    static Optional<SSLSocketFactory> socketFactory(CollectorSettings s, UnaryOperator<String> environment) {
        if (s.trustStorePath().isEmpty() && s.keyStorePath().isEmpty()) {
            return Optional.empty();
        }
        try {
            TrustManagerFactory tmf = null;
            if (s.trustStorePath().isPresent()) {
                char[] pw = s.trustStorePassword().map(r -> r.resolve(environment)).orElse(null);
                KeyStore trust = load(s.trustStorePath().get(), pw);
                tmf = TrustManagerFactory.getInstance(TrustManagerFactory.getDefaultAlgorithm());
                tmf.init(trust);
                clear(pw);
            }
            KeyManagerFactory kmf = null;
            if (s.keyStorePath().isPresent()) {
                char[] pw = s.keyStorePassword().map(r -> r.resolve(environment)).orElse(new char[0]);
                KeyStore keys = load(s.keyStorePath().get(), pw);
                kmf = KeyManagerFactory.getInstance(KeyManagerFactory.getDefaultAlgorithm());
                kmf.init(keys, pw);
                clear(pw);
            }
            SSLContext context = SSLContext.getInstance("TLS");
            context.init(kmf == null ? null : kmf.getKeyManagers(), tmf == null ? null : tmf.getTrustManagers(), null);
            return Optional.of(context.getSocketFactory());
        } catch (GeneralSecurityException | IOException e) {
            throw new IllegalStateException("TLS stores cannot be used: " + e.getClass().getSimpleName()
                    + " (trust store " + s.trustStorePath().orElse("none") + ", key store "
                    + s.keyStorePath().orElse("none") + ")", e);
        }
    }

    private static KeyStore load(String path, char[] password) throws GeneralSecurityException, IOException {
        // KeyStore.getInstance(File, ...) recognises PKCS#12 and JKS by their content.
        try (InputStream ignored = Files.newInputStream(Path.of(path))) {
            return KeyStore.getInstance(Path.of(path).toFile(), password);
        }
    }

    private static void clear(char[] secret) {
        if (secret != null) {
            Arrays.fill(secret, '\0');
        }
    }
}
