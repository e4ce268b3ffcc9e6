"""Builds the Python module descent_sizer for `pip install .` with the project's CMake: the
core and python/ only (no Qt, no tests), for the interpreter running pip, then puts the
module where setuptools packs it. The version is the CMake project's."""

import os
import pathlib
import re
import shutil
import subprocess
import sys

from setuptools import Extension, setup
from setuptools.command.build_ext import build_ext

ROOT = pathlib.Path(__file__).resolve().parent


def project_version():
    text = (ROOT / "CMakeLists.txt").read_text()
    return re.search(r"project\(descent_sizer VERSION ([0-9.]+)", text).group(1)


class CMakeExtension(Extension):
    def __init__(self, name):
        super().__init__(name, sources=[])


class CMakeBuild(build_ext):
    def build_extension(self, ext):
        build = pathlib.Path(self.build_temp).resolve() / "cmake"
        configure = ["cmake", "-S", str(ROOT), "-B", str(build),
                     "-DCMAKE_BUILD_TYPE=Release",
                     "-DDESCENT_SIZER_BUILD_GUI=OFF",
                     "-DDESCENT_SIZER_BUILD_TESTS=OFF",
                     "-DDESCENT_SIZER_BUILD_PYTHON=ON",
                     f"-DPython_EXECUTABLE={sys.executable}"]
        if shutil.which("ninja"):
            configure += ["-G", "Ninja"]
        subprocess.run(configure, check=True)
        jobs = os.environ.get("CMAKE_BUILD_PARALLEL_LEVEL", "2")
        subprocess.run(["cmake", "--build", str(build), "--target", "descent_sizer_python",
                        "--parallel", jobs], check=True)
        built = sorted(build.glob("descent_sizer*.so"))
        if not built:
            sys.exit("setup.py: the build made no descent_sizer module (are python3-dev and "
                     "pybind11-dev installed?)")
        target = pathlib.Path(self.get_ext_fullpath(ext.name))
        target.parent.mkdir(parents=True, exist_ok=True)
        shutil.copyfile(built[0], target)


setup(
    version=project_version(),
    packages=[],
    ext_modules=[CMakeExtension("descent_sizer")],
    cmdclass={"build_ext": CMakeBuild},
    # Not build/: that is the CMake build folder of the README.
    options={"build": {"build_base": "build-pip"}},
)
