package dev.pressmark.store.jdbc;

import dev.pressmark.core.sign.SignatureException;
import dev.pressmark.core.sign.SigningKeys;
import dev.pressmark.store.Names;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.TrustedKey;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/** The {@code trusted_keys} table: the public keys whose bundle signatures the store accepts. */
final class KeyRows {

    private final Transactions tx;
    private final Clock clock;

    KeyRows(Transactions tx, Clock clock) {
        this.tx = tx;
        this.clock = clock;
    }

    TrustedKey trust(String publicKeyPem, String actor) {
        Objects.requireNonNull(publicKeyPem, "publicKeyPem");
        Names.actor(actor);
        String keyId = keyId(publicKeyPem);
        long now = clock.millis();
        return tx.write("trust key " + keyId, c -> {
            for (TrustedKey key : list(c)) {
                if (key.keyId().equals(keyId)) {
                    return key;
                }
            }
            try (PreparedStatement insert = c.prepareStatement("INSERT INTO trusted_keys (key_id, public_key_pem, added_at, actor) VALUES (?, ?, ?, ?)")) {
                insert.setString(1, keyId);
                insert.setString(2, publicKeyPem);
                insert.setLong(3, now);
                insert.setString(4, actor);
                insert.executeUpdate();
            }
            EventRows.append(c, now, actor, StoreEvent.TRUST, StoreEvent.STORE_WIDE, keyId, "trusted Ed25519 key " + keyId);
            return new TrustedKey(keyId, publicKeyPem, Instant.ofEpochMilli(now), actor);
        });
    }

    void distrust(String keyId, String actor) {
        Objects.requireNonNull(keyId, "keyId");
        Names.actor(actor);
        long now = clock.millis();
        tx.write("stop trusting key " + keyId, c -> {
            int removed;
            try (PreparedStatement delete = c.prepareStatement("DELETE FROM trusted_keys WHERE key_id = ?")) {
                delete.setString(1, keyId);
                removed = delete.executeUpdate();
            }
            if (removed == 0) {
                throw new StoreException(StoreException.NO_SUCH_KEY, "no trusted key " + keyId + "; trusted keys: "
                        + list(c).stream().map(TrustedKey::keyId).toList());
            }
            EventRows.append(c, now, actor, StoreEvent.DISTRUST, StoreEvent.STORE_WIDE, keyId, "stopped trusting key " + keyId);
            return null;
        });
    }

    List<TrustedKey> trustedKeys() {
        return tx.read("list the trusted keys", KeyRows::list);
    }

    /** The key id of a public key PEM, or an {@link StoreException#INVALID_KEY} failure. */
    private static String keyId(String publicKeyPem) {
        try {
            return SigningKeys.keyId(SigningKeys.readPublicKey(publicKeyPem, "the public key"));
        } catch (SignatureException e) {
            throw new StoreException(StoreException.INVALID_KEY, e.getMessage(), e);
        }
    }

    static List<TrustedKey> list(Connection c) throws SQLException {
        List<TrustedKey> keys = new ArrayList<>();
        try (PreparedStatement select = c.prepareStatement("SELECT key_id, public_key_pem, added_at, actor FROM trusted_keys ORDER BY key_id");
                ResultSet rs = select.executeQuery()) {
            while (rs.next()) {
                keys.add(new TrustedKey(rs.getString(1), rs.getString(2), Instant.ofEpochMilli(rs.getLong(3)), rs.getString(4)));
            }
        }
        return keys;
    }
}
