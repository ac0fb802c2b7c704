#!/usr/bin/python3
"""Writes scikit-learn's sample-weighted metrics for generated predictions, the reference for
WeightedMetricsReferenceTest.

    /usr/bin/python3 scripts/sklearn-weighted-metrics-reference.py \
        > model-core/src/test/resources/reference/sklearn-weighted-metrics.json

scikit-learn 1.2.1 from Debian's python3-sklearn (apt-get install python3-sklearn). Each case holds
labels, predictions, a score per row and class (ties common: a grid of 0.25 steps), and a weight per
row (three decimals in [0, 3), about one row in seven weighing 0), then scikit-learn's values:
confusion_matrix, accuracy_score, balanced_accuracy_score, precision/recall/F1 per class and
macro-averaged (zero_division=0, labels = every class), cohen_kappa_score, matthews_corrcoef, and
per class roc_auc_score and average_precision_score of that class against the rest (for two
classes, class 0 ranks by the negated score of class 1, as pressmark does).
"""
import json
import random
import sys

import sklearn
from sklearn.metrics import (accuracy_score, average_precision_score, balanced_accuracy_score,
                             cohen_kappa_score, confusion_matrix, matthews_corrcoef,
                             precision_recall_fscore_support, roc_auc_score)

rng = random.Random(20261205)


def case(n, k, hit):
    truth = [i if i < k else rng.randrange(k) for i in range(n)]
    rng.shuffle(truth)
    predicted = [t if rng.random() < hit else rng.randrange(k) for t in truth]
    weights = [0.0 if rng.random() < 1 / 7 else round(rng.uniform(0, 3), 3) for _ in range(n)]
    if k == 2:
        positive = [(rng.randrange(6) + (1 if t == 1 and rng.random() < 0.6 else 0)) * 0.25 for t in truth]
        columns = [[-s for s in positive], positive]
        scores = positive
    else:
        rows = [[(rng.randrange(6) + (1 if t == c and rng.random() < 0.6 else 0)) * 0.25 for c in range(k)]
                for t in truth]
        columns = [[row[c] for row in rows] for c in range(k)]
        scores = [s for row in rows for s in row]
    labels = list(range(k))
    p, r, f, _ = precision_recall_fscore_support(truth, predicted, labels=labels, average=None,
                                                 sample_weight=weights, zero_division=0)
    mp, mr, mf, _ = precision_recall_fscore_support(truth, predicted, labels=labels, average="macro",
                                                    sample_weight=weights, zero_division=0)
    auc = [roc_auc_score([1 if t == c else 0 for t in truth], columns[c], sample_weight=weights) for c in labels]
    ap = [average_precision_score([1 if t == c else 0 for t in truth], columns[c], sample_weight=weights)
          for c in labels]
    return {
        "class_count": k, "truth": truth, "predicted": predicted, "scores": scores, "weights": weights,
        "confusion": confusion_matrix(truth, predicted, labels=labels, sample_weight=weights).tolist(),
        "accuracy": accuracy_score(truth, predicted, sample_weight=weights),
        "balanced_accuracy": balanced_accuracy_score(truth, predicted, sample_weight=weights),
        "precision": p.tolist(), "recall": r.tolist(), "f1": f.tolist(),
        "macro_precision": mp, "macro_recall": mr, "macro_f1": mf,
        "kappa": cohen_kappa_score(truth, predicted, sample_weight=weights),
        "mcc": matthews_corrcoef(truth, predicted, sample_weight=weights),
        "roc_auc": auc, "average_precision": ap,
    }


cases = [case(60, 2, 0.7), case(200, 2, 0.85), case(90, 3, 0.6), case(150, 5, 0.5), case(40, 4, 0.8)]
# One case per line, so that a change reads well in a diff.
sys.stdout.write('{"source": ' + json.dumps("scikit-learn " + sklearn.__version__ + " metrics with sample_weight")
                 + ',\n"cases": [\n')
sys.stdout.write(",\n".join(json.dumps(c, sort_keys=True) for c in cases))
sys.stdout.write("\n]}\n")
