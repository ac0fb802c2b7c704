package dev.pressmark.store.lifecycle;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.BundleLimits;
import dev.pressmark.core.contract.Contract;
import dev.pressmark.core.contract.ContractRecord;
import dev.pressmark.core.contract.SemanticVersion;
import dev.pressmark.store.StoreException;
import java.util.Optional;

/**
 * The store's rules for "is this a bundle it may keep or make active": the archive's checksums
 * hold (the reader checks them) and its contents load as a model within {@link BundleLimits#DEFAULT};
 * and, at publish, its contract does not break the active version's unless that is allowed. Turns
 * the reader's failures into the store's codes. The signature rule is {@link SignatureCheck}.
 */
public final class PublishCheck {

    private PublishCheck() {
    }

    /** The store's refusal of bytes the archive reader refused; {@code prefix} (may be empty) goes in front of the message. */
    public static StoreException notABundle(BundleException e, String prefix) {
        if (BundleException.TOO_LARGE.equals(e.code())) {
            return new StoreException(StoreException.LIMIT, prefix + e.getMessage(), e);
        }
        String message = e.getMessage().startsWith("not a bundle") ? e.getMessage() : "not a valid bundle: " + e.getMessage();
        return new StoreException(StoreException.NOT_A_BUNDLE, prefix + message, e);
    }

    /**
     * Loads verified contents as a model; a failure is {@link StoreException#LIMIT} or
     * {@link StoreException#UNUSABLE} whose message is {@code what}, the version's name and why.
     */
    public static Bundle load(BundleContents contents, String model, String tag, String what) {
        try {
            return Bundle.from(contents, model + " " + tag, BundleLimits.DEFAULT);
        } catch (BundleException e) {
            String code = BundleException.LIMIT.equals(e.code()) ? StoreException.LIMIT : StoreException.UNUSABLE;
            return failed(code, what + e.getMessage(), e);
        } catch (RuntimeException e) {
            // the reader maps what it foresees; anything else from these bytes still means they are no usable model
            return failed(StoreException.UNUSABLE, what + model + " " + tag + ": not a usable model: " + e, e);
        }
    }

    /**
     * The contract record of {@code model} {@code tag} (its manifest in {@code contents}) against the
     * active version {@code activeTag}, whose manifest and contract record (absent for a version
     * published before the store kept them: contract 1.0.0) are given; refused with
     * {@link StoreException#BREAKING} when it breaks that contract and {@code allowBreaking} is false.
     */
    public static ContractRecord contract(String model, String tag, BundleContents contents, String activeTag, String activeManifestJson,
            Optional<String> activeContractJson, boolean allowBreaking) {
        SemanticVersion activeVersion = activeContractJson.map(json -> ContractRecord.parse(json).version()).orElse(SemanticVersion.FIRST);
        ContractRecord record = ContractRecord.against(activeTag, Contract.ofManifestJson(activeManifestJson), activeVersion,
                Contract.of(contents.typedManifest()));
        if (record.diff().breaking() && !allowBreaking) {
            throw new StoreException(StoreException.BREAKING, "cannot publish " + model + " " + tag + ": it breaks the contract of the active"
                    + " version " + activeTag + " (" + activeVersion + "): " + record.diff().describe()
                    + "; allow breaking changes to publish it as contract " + record.version());
        }
        return record;
    }

    private static Bundle failed(String code, String message, RuntimeException cause) {
        throw new StoreException(code, message, cause);
    }
}
