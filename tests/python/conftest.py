"""What the Python suites share: the module, the shipped samples and the command line to
compare with. CTest sets PYTHONPATH to the module's folder, DESCENT_SIZER_BINARY to the
descent-sizer program and DESCENT_SIZER_SAMPLES_DIR to samples/ (tests/python/CMakeLists.txt)."""

import json
import os
import pathlib
import subprocess

import pytest

SAMPLES_DIR = pathlib.Path(os.environ["DESCENT_SIZER_SAMPLES_DIR"])
BINARY = os.environ["DESCENT_SIZER_BINARY"]

SAMPLES = sorted(path.stem for path in SAMPLES_DIR.glob("*.json"))


def sample_path(name):
    return SAMPLES_DIR / f"{name}.json"


def sample_document(name):
    return json.loads(sample_path(name).read_text())


class Run:
    """One run of the command line: its exit code and what it printed."""

    def __init__(self, completed):
        self.exit_code = completed.returncode
        self.out = completed.stdout
        self.err = completed.stderr

    def json(self):
        assert self.exit_code == 0, self.err
        return json.loads(self.out)


def run_command(*arguments):
    return Run(subprocess.run([BINARY, *map(str, arguments)], capture_output=True, text=True,
                              check=False))


@pytest.fixture(scope="session")
def ds():
    import descent_sizer

    return descent_sizer
