package dev.pressmark.cli;

import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.Sha256;
import dev.pressmark.core.io.AtomicFiles;
import dev.pressmark.core.sign.BundleSignature;
import dev.pressmark.core.sign.SigningKeys;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.security.KeyPair;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark sign}: write a bundle's signature file. */
@Command(name = "sign", mixinStandardHelpOptions = true,
        description = "Check a bundle's checksums and sign its SHA-256 with an Ed25519 private key; publish picks up BUNDLE.sig.")
final class SignCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "BUNDLE", description = "The bundle file (.pmb).")
    Path bundle;

    @Option(names = "--key", required = true, paramLabel = "FILE", description = "The private key, as `pressmark keygen` writes it.")
    Path key;

    @Option(names = "--out", paramLabel = "FILE", description = "Where to write the signature (default: BUNDLE.sig).")
    Path out;

    @Override
    public Integer call() {
        byte[] bytes = InputFiles.readBundle(bundle);
        try {
            BundleArchive.read(bytes);
        } catch (BundleException e) {
            throw new BundleException(e.code(), bundle + ": " + e.getMessage(), e);
        }
        KeyPair keys = SigningKeys.readPrivateKey(InputFiles.readText(key), key.toString());
        BundleSignature signature = BundleSignature.sign(Sha256.hex(bytes), keys);
        Path target = out != null ? out : signatureFile(bundle);
        AtomicFiles.write(target, o -> o.write((signature.toJson() + "\n").getBytes(StandardCharsets.UTF_8)));
        System.out.printf("signed %s (sha256 %s) with key %s: %s%n", bundle, signature.sha256(), signature.keyId(), target);
        return Main.EXIT_OK;
    }

    /** The signature file publish looks for beside {@code bundle}. */
    static Path signatureFile(Path bundle) {
        return bundle.resolveSibling(bundle.getFileName() + BundleSignature.SUFFIX);
    }
}
