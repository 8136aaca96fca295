// The single Catch2 entry point linked into every test executable.
#define CATCH_CONFIG_MAIN
#include <catch2/catch.hpp>
