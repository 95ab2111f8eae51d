#!/usr/bin/python3
"""Builds the committed seed corpora of the fuzz targets (tests/fuzz/corpus/<target>)
from the project's fixtures and sample projects. Run from anywhere:

    /usr/bin/python3 tests/fuzz/make_seed_corpus.py

csv_model: each model folder's six files joined by the separator of fuzz_support.h
           ("\\n%%\\n"), '-' standing for an absent file.
scor:      the smaller published networks of tests/fixtures/reference/scor, the two
           format examples, and damaged copies of one (cut short, counts changed).
survey:    the invented reservoir survey of sample_projects/reservoir_survey (its five
           files joined like csv_model: hauls, strata, lengths, stomachs, taxa), a cut-down
           copy, one without strata, one with swept_area_km2 instead of tow length and
           wing spread, and damaged copies (a column missing, a bad number, CRLF, cut short).
project:   the sample projects and the version-1 fixture, made small (page size 512,
           rollback journal, VACUUM) so that a mutation has a chance to hit a row,
           plus a few damaged headers.
The seeds are the fixtures' own data (their sources are named beside them); nothing
here is new data.
"""
import pathlib
import shutil
import sqlite3
import tempfile

ROOT = pathlib.Path(__file__).resolve().parents[2]
OUT = ROOT / "tests" / "fuzz" / "corpus"
FILES = ["compartments.csv", "diet.csv", "harvest.csv", "detritus_routing.csv",
         "confidence.csv", "settings.csv"]
SEPARATOR = b"\n%%\n"


def csv_seeds():
    folders = sorted(p for p in (ROOT / "tests/fixtures/bad_csv").iterdir() if p.is_dir())
    folders += [ROOT / "tests/fixtures/csv_every_file", ROOT / "tests/fixtures/csv_models/pond",
                ROOT / "tests/fixtures/csv_models/pond_quirks", ROOT / "sample_projects/reservoir"]
    out = OUT / "csv_model"
    for folder in folders:
        parts = [(folder / f).read_bytes() if (folder / f).exists() else b"-" for f in FILES]
        while parts and parts[-1] == b"-":
            parts.pop()
        name = folder.name if folder.parent.name == "bad_csv" else folder.parent.name + "_" + folder.name
        (out / f"{name}.seed").write_bytes(SEPARATOR.join(parts))


def scor_seeds():
    out = OUT / "scor"
    sources = sorted((ROOT / "tests/fixtures/reference/scor").glob("*.scor"), key=lambda p: p.stat().st_size)[:12]
    sources += sorted((ROOT / "tests/fixtures/reference/scor_examples").glob("*.dat"))
    for s in sources:
        shutil.copyfile(s, out / s.name)
    text = (ROOT / "tests/fixtures/reference/scor/lake_findley.scor").read_bytes()
    lines = text.split(b"\n")
    (out / "damaged_cut_short.scor").write_bytes(b"\n".join(lines[: len(lines) // 2]))
    (out / "damaged_counts.scor").write_bytes(b"\n".join([lines[0], b"  3  9"] + lines[2:]))
    (out / "damaged_crlf.scor").write_bytes(text.replace(b"\n", b"\r\n"))


SURVEY_FILES = ["hauls.csv", "strata.csv", "lengths.csv", "stomachs.csv", "taxa.csv"]


def survey_seeds():
    out = OUT / "survey"
    folder = ROOT / "sample_projects/reservoir_survey"
    files = {f: (folder / f).read_bytes() for f in SURVEY_FILES}

    def seed(name, **changed):
        parts = [changed.get(f.replace(".csv", ""), files[f]) for f in SURVEY_FILES]
        (out / f"{name}.seed").write_bytes(SEPARATOR.join(parts))

    def head(data, lines):
        return b"\n".join(data.split(b"\n")[:lines]) + b"\n"

    seed("reservoir_survey")
    small = dict(hauls=head(files["hauls.csv"], 25), lengths=head(files["lengths.csv"], 12),
                 stomachs=head(files["stomachs.csv"], 30))
    seed("reservoir_survey_small", **small)
    seed("no_strata", strata=b"-", **{k: v for k, v in small.items() if k != "strata"})
    # swept_area_km2 given directly: tow length (km) x wing spread (m) / 1000.
    rows = [r.split(b",") for r in head(files["hauls.csv"], 25).strip().split(b"\n")]
    swept = [b",".join(r[:5] + [b"swept_area_km2"] + r[7:]) if i == 0 else
             b",".join(r[:5] + [b"%.5f" % (float(r[5]) * float(r[6]) / 1000.0)] + r[7:]) for i, r in enumerate(rows)]
    seed("swept_area_column", hauls=b"\n".join(swept) + b"\n", **{k: v for k, v in small.items() if k != "hauls"})
    seed("damaged_missing_catch", hauls=small["hauls"].replace(b",catch_kg", b",catch"),
         **{k: v for k, v in small.items() if k != "hauls"})
    seed("damaged_bad_number", lengths=small["lengths"].replace(b",12,", b",1e400,", 1),
         **{k: v for k, v in small.items() if k != "lengths"})
    seed("damaged_crlf", **{k: v.replace(b"\n", b"\r\n") for k, v in small.items()})
    seed("damaged_cut_short", hauls=small["hauls"][: len(small["hauls"]) // 2],
         stomachs=small["stomachs"][:40], lengths=small["lengths"])


def shrink(source, target):
    shutil.copyfile(source, target)
    con = sqlite3.connect(target)
    con.execute("PRAGMA journal_mode=DELETE")
    con.execute("PRAGMA page_size=512")
    con.execute("VACUUM")
    con.close()


def project_seeds():
    out = OUT / "project"
    for source in [ROOT / "sample_projects/reservoir.tledger", ROOT / "sample_projects/lagoon.tledger",
                   ROOT / "tests/fixtures/store/v1_project.tledger"]:
        shrink(source, out / source.name)
    small = (out / "reservoir.tledger").read_bytes()
    (out / "damaged_cut_short.tledger").write_bytes(small[: len(small) // 3])
    (out / "damaged_header_only.tledger").write_bytes(small[:100])
    (out / "not_sqlite.tledger").write_bytes(b"name,kind\nPike,consumer\n")
    foreign = bytearray(small)
    foreign[68:72] = b"\x00\x00\x00\x00"  # application id of no program
    (out / "foreign_application_id.tledger").write_bytes(bytes(foreign))


def main():
    for sub in ["csv_model", "scor", "project", "survey"]:
        shutil.rmtree(OUT / sub, ignore_errors=True)
        (OUT / sub).mkdir(parents=True)
    csv_seeds()
    scor_seeds()
    project_seeds()
    survey_seeds()
    for sub in ["csv_model", "scor", "project", "survey"]:
        files = list((OUT / sub).iterdir())
        print(f"{sub}: {len(files)} seeds, {sum(f.stat().st_size for f in files)} bytes")


if __name__ == "__main__":
    main()
