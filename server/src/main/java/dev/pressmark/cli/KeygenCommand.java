package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.io.AtomicFiles;
import dev.pressmark.core.sign.SigningKeys;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.KeyPair;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code pressmark keygen}: a new Ed25519 key pair for signing bundles. */
@Command(name = "keygen", mixinStandardHelpOptions = true,
        description = {"Make an Ed25519 key pair for signing bundles.",
            "FILE holds the private key (PKCS#8 PEM, readable by you only), FILE.pub the public key (X.509 PEM) to give to `pressmark trust`."})
final class KeygenCommand implements Callable<Integer> {

    static final String PUBLIC_SUFFIX = ".pub";
    static final String PRIVATE_PERMISSIONS = "rw-------";

    @Option(names = "--out", required = true, paramLabel = "FILE", description = "Where to write the private key; the public key goes to FILE.pub.")
    Path out;

    @Option(names = "--force", description = "Replace FILE and FILE.pub if they exist.")
    boolean force;

    @Override
    public Integer call() {
        Path publicFile = publicFile(out);
        for (Path file : new Path[] {out, publicFile}) {
            if (Files.exists(file) && !force) {
                throw new PressmarkException("file-exists", file + " exists; pass --force to replace it (a replaced private key is lost)");
            }
        }
        KeyPair keys = SigningKeys.generate();
        AtomicFiles.write(out, PRIVATE_PERMISSIONS, o -> o.write(SigningKeys.privateKeyPem(keys.getPrivate()).getBytes(StandardCharsets.US_ASCII)));
        AtomicFiles.write(publicFile, o -> o.write(SigningKeys.publicKeyPem(keys.getPublic()).getBytes(StandardCharsets.US_ASCII)));
        System.out.printf("wrote private key %s and public key %s (key id %s)%n", out, publicFile, SigningKeys.keyId(keys.getPublic()));
        return Main.EXIT_OK;
    }

    static Path publicFile(Path privateFile) {
        return privateFile.resolveSibling(privateFile.getFileName() + PUBLIC_SUFFIX);
    }
}
