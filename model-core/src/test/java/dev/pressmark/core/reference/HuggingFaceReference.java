package dev.pressmark.core.reference;

import ai.djl.huggingface.tokenizers.HuggingFaceTokenizer;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;

/**
 * The reference WordPiece tokenizer: the Hugging Face tokenizers library (Apache-2.0), reached
 * through its Java binding {@code ai.djl.huggingface:tokenizers}, built from our vocabulary with the
 * BERT normaliser, the BERT pre-tokeniser and the WordPiece model, and no special tokens added.
 * The build runs it offline ({@code DJL_OFFLINE}, {@code OPT_OUT_TRACKING}, {@code ai.djl.offline}).
 */
public final class HuggingFaceReference implements AutoCloseable {

    private final HuggingFaceTokenizer tokenizer;

    public HuggingFaceReference(WordPieceVocabulary vocabulary, TextNormalizer normalizer, int maxWordChars, Path workDir) {
        try {
            Path file = Files.createTempFile(workDir, "tokenizer", ".json");
            Files.writeString(file, tokenizerJson(vocabulary, normalizer, maxWordChars));
            tokenizer = HuggingFaceTokenizer.builder()
                    .optTokenizerPath(file)
                    .optAddSpecialTokens(false)
                    .optTruncation(false)
                    .optPadding(false)
                    .build();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The reference's token strings for {@code text}. */
    public List<String> tokenize(String text) {
        return Arrays.asList(tokenizer.encode(text).getTokens());
    }

    /** The reference's token ids for {@code text}; what the benchmark measures. */
    public long[] encodeIds(String text) {
        return tokenizer.encode(text).getIds();
    }

    static String tokenizerJson(WordPieceVocabulary vocabulary, TextNormalizer normalizer, int maxWordChars) {
        ObjectMapper json = new ObjectMapper();
        ObjectNode root = json.createObjectNode();
        root.put("version", "1.0");
        root.putNull("truncation");
        root.putNull("padding");
        root.putArray("added_tokens");
        ObjectNode norm = root.putObject("normalizer");
        norm.put("type", "BertNormalizer");
        norm.put("clean_text", true);
        norm.put("handle_chinese_chars", normalizer.cjk());
        norm.put("strip_accents", normalizer.stripAccents());
        norm.put("lowercase", normalizer.lowercase());
        root.putObject("pre_tokenizer").put("type", "BertPreTokenizer");
        root.putNull("post_processor");
        root.putNull("decoder");
        ObjectNode model = root.putObject("model");
        model.put("type", "WordPiece");
        model.put("unk_token", WordPieceVocabulary.UNK);
        model.put("continuing_subword_prefix", WordPieceVocabulary.CONTINUATION_PREFIX);
        model.put("max_input_chars_per_word", maxWordChars);
        ObjectNode vocab = model.putObject("vocab");
        for (int id = 0; id < vocabulary.size(); id++) {
            vocab.put(vocabulary.token(id), id);
        }
        return root.toString();
    }

    @Override
    public void close() {
        tokenizer.close();
    }
}
