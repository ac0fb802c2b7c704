package dev.pressmark.store.lifecycle;

import dev.pressmark.core.sign.BundleSignature;
import dev.pressmark.core.sign.SignatureException;
import dev.pressmark.core.sign.SigningKeys;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.TrustedKey;
import java.security.PublicKey;
import java.util.List;
import java.util.Optional;

/**
 * The one rule for bundle signatures, checked at publish and again at load against the store's
 * trusted keys: while the store trusts none a signature is optional, and while it trusts any a
 * bundle must carry a signature by one of them over its SHA-256.
 */
public final class SignatureCheck {

    private SignatureCheck() {
    }

    /**
     * Checks the signature of a bundle with SHA-256 {@code sha256} for {@code what} ("publish
     * routing 2" or so). Without trusted keys a signature is optional, but one that is given must
     * at least be well-formed and name this bundle's SHA-256. With trusted keys it must verify.
     */
    public static void check(Optional<String> signatureJson, String sha256, List<TrustedKey> trusted, String what) {
        if (signatureJson.isEmpty()) {
            if (!trusted.isEmpty()) {
                throw new StoreException(StoreException.UNSIGNED, what + ": the bundle is unsigned, and this store accepts only bundles signed by"
                        + " one of its trusted keys " + ids(trusted));
            }
            return;
        }
        BundleSignature signature;
        try {
            signature = BundleSignature.parse(signatureJson.get(), "the signature");
        } catch (SignatureException e) {
            throw new StoreException(StoreException.BAD_SIGNATURE, what + ": " + e.getMessage(), e);
        }
        if (!signature.sha256().equals(sha256)) {
            throw new StoreException(StoreException.BAD_SIGNATURE, what + ": the signature by key " + signature.keyId()
                    + " is for a bundle with SHA-256 " + signature.sha256() + ", not this one (" + sha256 + ")");
        }
        if (trusted.isEmpty()) {
            return;
        }
        TrustedKey key = trusted.stream().filter(k -> k.keyId().equals(signature.keyId())).findFirst()
                .orElseThrow(() -> new StoreException(StoreException.BAD_SIGNATURE, what + ": the bundle is signed by key " + signature.keyId()
                        + ", which this store does not trust; trusted keys: " + ids(trusted)));
        PublicKey publicKey = SigningKeys.readPublicKey(key.publicKeyPem(), "trusted key " + key.keyId());
        if (!signature.verifies(sha256, publicKey)) {
            throw new StoreException(StoreException.BAD_SIGNATURE, what + ": the signature by key " + signature.keyId()
                    + " does not verify over the bundle's SHA-256 " + sha256);
        }
    }

    private static String ids(List<TrustedKey> keys) {
        return keys.stream().map(TrustedKey::keyId).toList().toString();
    }
}
