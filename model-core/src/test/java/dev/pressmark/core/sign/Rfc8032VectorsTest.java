package dev.pressmark.core.sign;

import static org.assertj.core.api.Assertions.assertThat;

import java.security.KeyPair;
import java.util.HexFormat;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The Ed25519 test vectors of RFC 8032 (Edwards-Curve Digital Signature Algorithm, January 2017),
 * section 7.1: TEST 1, TEST 2, TEST 3 and TEST SHA(abc), copied from the RFC's hex. From the
 * secret key alone the JDK must derive exactly the RFC's public key and signature.
 */
class Rfc8032VectorsTest {

    private static final HexFormat HEX = HexFormat.of();

    @ParameterizedTest(name = "{0}")
    @CsvSource({
        "TEST 1, 9d61b19deffd5a60ba844af492ec2cc44449c5697b326919703bac031cae7f60,"
                + " d75a980182b10ab7d54bfed3c964073a0ee172f3daa62325af021a68f707511a, '',"
                + " e5564300c360ac729086e2cc806e828a84877f1eb8e5d974d873e065224901555fb8821590a33bacc61e39701cf9b46bd25bf5f0595bbe24655141438e7a100b",
        "TEST 2, 4ccd089b28ff96da9db6c346ec114e0f5b8a319f35aba624da8cf6ed4fb8a6fb,"
                + " 3d4017c3e843895a92b70aa74d1b7ebc9c982ccf2ec4968cc0cd55f12af4660c, 72,"
                + " 92a009a9f0d4cab8720e820b5f642540a2b27b5416503f8fb3762223ebdb69da085ac1e43e15996e458f3613d0f11d8c387b2eaeb4302aeeb00d291612bb0c00",
        "TEST 3, c5aa8df43f9f837bedb7442f31dcb7b166d38535076f094b85ce3a2e0b4458f7,"
                + " fc51cd8e6218a1a38da47ed00230f0580816ed13ba3303ac5deb911548908025, af82,"
                + " 6291d657deec24024827e69c3abe01a30ce548a284743a445e3680d7db5ac3ac18ff9b538d16f290ae67f760984dc6594a7c15e9716ed28dc027beceea1ec40a",
        "TEST SHA(abc), 833fe62409237b9d62ec77587520911e9a759cec1d19755b7da901b96dca3d42,"
                + " ec172b93ad5e563bf4932c70e1245034c35467ef2efd4d64ebf819683467e2bf,"
                + " ddaf35a193617abacc417349ae20413112e6fa4e89a97ea20a9eeee64b55d39a2192992a274fc1a836ba3c23a3feebbd454d4423643ce80e2a9ac94fa54ca49f,"
                + " dc2a4459e7369633a52b1bf277839a00201009a3efbf3ecb69bea2186c26b58909351fc9ac90b3ecfdfbc7c66431e0303dca179c138ac17ad9bef1177331a704",
    })
    void the_rfc_secret_key_gives_the_rfc_public_key_and_signature(String name, String secret, String publicKey, String message,
            String signature) {
        byte[] msg = message == null ? new byte[0] : HEX.parseHex(message);
        KeyPair keys = SigningKeys.fromSeed(HEX.parseHex(secret));
        assertThat(HEX.formatHex(SigningKeys.rawPublicKey(keys.getPublic()))).as(name + " public key").isEqualTo(publicKey);
        byte[] signed = BundleSignature.ed25519Sign(keys.getPrivate(), msg);
        assertThat(HEX.formatHex(signed)).as(name + " signature").isEqualTo(signature);
        assertThat(BundleSignature.ed25519Verify(keys.getPublic(), msg, HEX.parseHex(signature))).isTrue();
        byte[] flipped = HEX.parseHex(signature);
        flipped[0] ^= 1;
        assertThat(BundleSignature.ed25519Verify(keys.getPublic(), msg, flipped)).isFalse();
        byte[] longer = java.util.Arrays.copyOf(msg, msg.length + 1);
        assertThat(BundleSignature.ed25519Verify(keys.getPublic(), longer, HEX.parseHex(signature))).isFalse();
    }
}
