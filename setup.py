"""Build the Python module with the project's CMake build, for `pip install .`
(metadata in pyproject.toml; docs/python.md says how to run it offline).

CMake configures a build of its own under build-pip/ (tests, benchmark and tool
off) and builds only the module target; the package gets a copy of groups/*.toml
and the response catalogue in tensorsieve/data, which the module reads wherever pip
put it. TENSORSIEVE_PREBUILT_MODULE=path/to/_tensorsieve*.so skips CMake and packs
a module built before (the test suite's packaging check uses it, so it need not
build the library a second time).
"""

import glob
import os
import shutil
import subprocess
import sys

from setuptools import Extension, setup
from setuptools.command.build_ext import build_ext
from setuptools.command.build_py import build_py

HERE = os.path.dirname(os.path.abspath(__file__))


class CMakeExtension(Extension):
    def __init__(self, name):
        super().__init__(name, sources=[])


class CMakeBuild(build_ext):
    def build_extension(self, ext):
        dest = self.get_ext_fullpath(ext.name)
        os.makedirs(os.path.dirname(dest), exist_ok=True)
        prebuilt = os.environ.get("TENSORSIEVE_PREBUILT_MODULE")
        if prebuilt:
            shutil.copyfile(prebuilt, dest)
            return
        build = os.path.join(os.path.abspath(self.build_temp), "cmake")
        configure = ["cmake", "-S", HERE, "-B", build, "-DCMAKE_BUILD_TYPE=Release",
                     "-DTENSORSIEVE_BUILD_TESTS=OFF", "-DTENSORSIEVE_BUILD_BENCH=OFF",
                     "-DTENSORSIEVE_BUILD_PYTHON=ON", "-DPython3_EXECUTABLE=" + sys.executable]
        if shutil.which("ccache"):
            configure.append("-DCMAKE_CXX_COMPILER_LAUNCHER=ccache")
        subprocess.check_call(configure)
        jobs = os.environ.get("CMAKE_BUILD_PARALLEL_LEVEL", "2")
        subprocess.check_call(["cmake", "--build", build, "--target", "tensorsieve_python", "-j", jobs])
        built = glob.glob(os.path.join(build, "python", "tensorsieve", "_tensorsieve*.so"))
        if len(built) != 1:
            raise RuntimeError(f"expected one built module in {build}/python/tensorsieve, found {built}")
        shutil.copyfile(built[0], dest)


class BuildWithData(build_py):
    """The package's own copy of the data the module reads at run time."""

    def run(self):
        super().run()
        data = os.path.join(self.build_lib, "tensorsieve", "data")
        os.makedirs(os.path.join(data, "groups"), exist_ok=True)
        os.makedirs(os.path.join(data, "responses"), exist_ok=True)
        for f in glob.glob(os.path.join(HERE, "groups", "*.toml")):
            shutil.copy(f, os.path.join(data, "groups"))
        for name in ("catalogue.toml", "families.toml"):
            shutil.copy(os.path.join(HERE, "src", "response", name), os.path.join(data, "responses"))


setup(
    packages=["tensorsieve"],
    package_dir={"tensorsieve": "python/tensorsieve"},
    ext_modules=[CMakeExtension("tensorsieve._tensorsieve")],
    cmdclass={"build_ext": CMakeBuild, "build_py": BuildWithData},
    options={"build": {"build_base": "build-pip"}},
    zip_safe=False,
)
