/// \file test_bad_input.cpp
/// \brief The corpus of broken scenes under tests/data/bad: each file names, in its
/// "# expect: LINE TEXT" header lines, the line its error must point at and a piece of
/// the message (the key or the rule). `terayee check` and `terayee run` must exit with
/// status 2, print file:line: for each, and leave nothing behind that looks like a result.
/// (Exit status 2 for bad input is our convention; file:line:col reporting is common
/// practice for compilers and other tools that read input files.)
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace fs = std::filesystem;

namespace {

int run(const std::string& cmd, std::string& out) {
  out.clear();
  FILE* p = popen((cmd + " 2>&1").c_str(), "r");
  REQUIRE(p);
  std::array<char, 4096> buf{};
  while (fgets(buf.data(), buf.size(), p)) out += buf.data();
  const int status = pclose(p);
  return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

}  // namespace

TEST_CASE("every scene in the bad-input corpus is rejected with its line and key, exit status 2") {
  const fs::path dir = fs::path(TERAYEE_SOURCE_DIR) / "tests/data/bad";
  int files = 0;
  for (const auto& entry : fs::directory_iterator(dir)) {
    if (entry.path().extension() != ".yaml") continue;
    ++files;
    const std::string file = entry.path().string();
    std::ifstream in(file);
    // "# expect: LINE TEXT" points into the scene; "# expect: NAME:LINE:COL TEXT" into a file
    // the scene reads (NAME in this folder), such as a waveform table.
    std::vector<std::pair<std::string, std::string>> expect;  // "FILE:LINE:" prefix, text
    for (std::string line; std::getline(in, line) && line.rfind("# expect: ", 0) == 0;) {
      const std::string rest = line.substr(10);
      const auto sp = rest.find(' ');
      const std::string where = rest.substr(0, sp);
      expect.emplace_back(
          where.find(':') == std::string::npos ? file + ":" + where + ":" : (dir / where).string() + ":",
          rest.substr(sp + 1));
    }
    INFO(file);
    REQUIRE(!expect.empty());
    std::string out;
    CHECK(run(std::string(TERAYEE_BINARY) + " check '" + file + "'", out) == 2);
    INFO(out);
    for (const auto& [where, text] : expect) {
      bool found = false;
      std::istringstream lines(out);
      for (std::string l; std::getline(lines, l);)
        if (l.find(where) == 0 && l.find(text) != std::string::npos) found = true;
      CHECK_MESSAGE(found, "expected an error at " << where << " mentioning " << text);
    }
    const fs::path runs = fs::temp_directory_path() / ("terayee-bad-" + entry.path().stem().string());
    fs::remove_all(runs);
    CHECK(run(std::string(TERAYEE_BINARY) + " run '" + file + "' -o '" + runs.string() + "'", out) == 2);
    CHECK_FALSE(fs::exists(runs / "fields.h5"));
    CHECK_FALSE(fs::exists(runs / "summary.json"));
    CHECK_FALSE(fs::exists(runs / "fields.h5.partial"));
    fs::remove_all(runs);
  }
  CHECK(files >= 20);
}

TEST_CASE("usage errors exit with status 2") {
  std::string out;
  CHECK(run(std::string(TERAYEE_BINARY) + " frobnicate", out) == 2);
  CHECK(run(std::string(TERAYEE_BINARY) + " run", out) == 2);
  CHECK(run(std::string(TERAYEE_BINARY) + " run /nonexistent.yaml -o /tmp/x", out) == 2);
  CHECK(run(std::string(TERAYEE_BINARY) + " --version", out) == 0);
  CHECK(out.find("terayee ") != std::string::npos);
}
