#!/usr/bin/python3
"""Builds the committed seed corpora of the fuzz targets (tests/fuzz/corpus/<target>)
from the project's fixtures and sample projects. Run from anywhere:

    /usr/bin/python3 tests/fuzz/make_seed_corpus.py

csv_model: each model folder's six files joined by the separator of fuzz_support.h
           ("\\n%%\\n"), '-' standing for an absent file.
scor:      the smaller published networks of tests/fixtures/reference/scor, the two
           format examples, and damaged copies of one (cut short, counts changed).
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
    for sub in ["csv_model", "scor", "project"]:
        shutil.rmtree(OUT / sub, ignore_errors=True)
        (OUT / sub).mkdir(parents=True)
    csv_seeds()
    scor_seeds()
    project_seeds()
    for sub in ["csv_model", "scor", "project"]:
        files = list((OUT / sub).iterdir())
        print(f"{sub}: {len(files)} seeds, {sum(f.stat().st_size for f in files)} bytes")


if __name__ == "__main__":
    main()
