#!/usr/bin/python3
"""Writes the character n-grams that scikit-learn's char_wb analyzer yields for a fixed set of texts,
the reference for CharNgramReferenceTest.

The "cases" hold words of letters only, the same words for pressmark's default word split (at every
punctuation mark) and for char_wb; the "whitespace_cases" hold punctuation inside words, for
pressmark's `word_split: whitespace`, which splits where char_wb does.

    /usr/bin/python3 scripts/sklearn-char-wb-reference.py \
        > model-core/src/test/resources/reference/sklearn-char-wb.json

scikit-learn 1.2.1 from Debian's python3-sklearn (apt-get install python3-sklearn). The texts are
words of letters only (no punctuation, which pressmark splits into words of their own while char_wb
keeps it inside words), so both sides see the same words; lowercase=False so that the analyzer does
not change them. Each n-gram is listed with its count, sorted, so that the file compares multisets.
"""
import json
import random
import sys

import sklearn
from sklearn.feature_extraction.text import CountVectorizer

rng = random.Random(20261204)
alphabet = "abcdefghijklmnopqrstuvwxyzéüøß"
texts = ["a", "ab", "abc", "quorubwick service kit", "x y z", "aaaa aaaa", "\U0001F600ab b\U0001F600",
         "mississippi", "ééé"]
for _ in range(30):
    words = ["".join(rng.choice(alphabet) for _ in range(rng.randint(1, 12))) for _ in range(rng.randint(1, 5))]
    texts.append(" ".join(words))

cases = []
for min_n, max_n in [(1, 1), (1, 4), (1, 5), (2, 3), (3, 5), (4, 4), (5, 10)]:
    analyzer = CountVectorizer(analyzer="char_wb", ngram_range=(min_n, max_n), lowercase=False).build_analyzer()
    for text in texts:
        counts = {}
        for gram in analyzer(text):
            counts[gram] = counts.get(gram, 0) + 1
        cases.append({"text": text, "min_n": min_n, "max_n": max_n,
                      "ngrams": [[g, c] for g, c in sorted(counts.items())]})

punctuated = ["Re: [SA] $$$ Cheap!!!", "o'brien-smith", "3/4in kit (x2)", "a.b.c", "--", "!"]
for _ in range(15):
    words = ["".join(rng.choice(alphabet + ".,:;!?'()[]$-/") for _ in range(rng.randint(1, 9)))
             for _ in range(rng.randint(1, 4))]
    punctuated.append(" ".join(words))
whitespace_cases = []
for min_n, max_n in [(1, 4), (1, 5), (2, 3)]:
    analyzer = CountVectorizer(analyzer="char_wb", ngram_range=(min_n, max_n), lowercase=False).build_analyzer()
    for text in punctuated:
        counts = {}
        for gram in analyzer(text):
            counts[gram] = counts.get(gram, 0) + 1
        whitespace_cases.append({"text": text, "min_n": min_n, "max_n": max_n,
                                 "ngrams": [[g, c] for g, c in sorted(counts.items())]})

# One case per line, so that a change reads well in a diff.
sys.stdout.write('{"source": ' + json.dumps("scikit-learn " + sklearn.__version__
                                             + " CountVectorizer(analyzer='char_wb', lowercase=False)") + ',\n"cases": [\n')
sys.stdout.write(",\n".join(json.dumps(case, ensure_ascii=False, sort_keys=True) for case in cases))
sys.stdout.write("\n],\n\"whitespace_cases\": [\n")
sys.stdout.write(",\n".join(json.dumps(case, ensure_ascii=False, sort_keys=True) for case in whitespace_cases))
sys.stdout.write("\n]}\n")
