/// \file test_atomic_file.cpp
/// \brief The write-to-temporary-then-rename helper: a name holds the old complete file or
/// the new one, never a part (POSIX.1-2017 rename(2): "If the link named by the new
/// argument exists, it shall be removed and old renamed to new" atomically), and no
/// temporary file is left behind, on success or failure.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>

#include "io/run/atomic_file.h"

namespace fs = std::filesystem;
using namespace ty;

namespace {
std::string slurp(const fs::path& p) {
  std::ifstream in(p);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}
void put(const std::string& path, const std::string& text) { std::ofstream(path) << text; }
}  // namespace

TEST_CASE("write_atomically replaces a file whole and leaves no temporary file") {
  const fs::path dir = fs::temp_directory_path() / "terayee-test-atomic";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const std::string path = (dir / "a.txt").string();
  put(path, "old");
  CHECK(temporary_name(path) == path + ".tmp");  // the same folder, so rename stays on one file system
  write_atomically(path, [](const std::string& tmp) { put(tmp, "new"); });
  CHECK(slurp(path) == "new");
  CHECK_FALSE(fs::exists(path + ".tmp"));

  SUBCASE("a writer that fails leaves the old file and no temporary") {
    CHECK_THROWS_AS(write_atomically(path,
                                     [](const std::string& tmp) {
                                       put(tmp, "half");
                                       throw std::runtime_error("disk full");
                                     }),
                    std::runtime_error);
    CHECK(slurp(path) == "new");
    CHECK_FALSE(fs::exists(path + ".tmp"));
  }
  SUBCASE("a rename that cannot happen is an error naming the file, and the temporary goes") {
    const std::string tmp = (dir / "b.tmp").string(), nowhere = (dir / "missing" / "b.txt").string();
    put(tmp, "x");
    try {
      commit_file(tmp, nowhere);
      FAIL("no error");
    } catch (const std::runtime_error& e) {
      CHECK(std::string(e.what()).find(nowhere) != std::string::npos);
    }
    CHECK_FALSE(fs::exists(tmp));
  }
  fs::remove_all(dir);
}

TEST_CASE("write_text_atomically writes the whole text") {
  const fs::path path = fs::temp_directory_path() / "terayee-test-atomic-text.json";
  write_text_atomically(path.string(), "{\"a\": 1}\n");
  CHECK(slurp(path) == "{\"a\": 1}\n");
  CHECK_FALSE(fs::exists(path.string() + ".tmp"));
  CHECK_THROWS_AS(write_text_atomically((fs::temp_directory_path() / "no-such-dir" / "x.json").string(), "x"),
                  std::runtime_error);
  fs::remove(path);
}
