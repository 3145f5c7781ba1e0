/// \file fuzz_scene.cpp
/// \brief libFuzzer target (LLVM libFuzzer, from Debian's clang) over the scene reader and
/// the whole-scene validation that `check` and `run` both apply. An input is YAML scene
/// text, optionally followed by a line "#--set" and one `--set` override per line. Every
/// input must end in a Scene or in BadInput (exit 2 for the user); any other exception, a
/// crash, a hang or a sanitizer report is a finding. Built and run by tools/fuzz.sh,
/// outside the test suite.
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <string>
#include <vector>

#include "io/scene/diagnostics.h"
#include "io/scene/scene_reader.h"
#include "io/scene/validation.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  if (size > 64 * 1024) return -1;  // scenes are small; longer inputs only slow the search
  const std::string input(reinterpret_cast<const char*>(data), size);
  std::string text = input;
  std::vector<std::string> sets;
  if (const auto cut = input.find("\n#--set\n"); cut != std::string::npos) {
    text = input.substr(0, cut + 1);
    std::size_t at = cut + 8;
    while (at < input.size()) {
      const auto end = input.find('\n', at);
      const std::string line = input.substr(at, end == std::string::npos ? std::string::npos : end - at);
      if (!line.empty()) sets.push_back(line);
      if (end == std::string::npos) break;
      at = end + 1;
    }
  }
  try {
    const ty::Scene s = ty::read_scene_text(text, "fuzz.yaml", sets);
    (void)ty::validate_scene(s, 4e9);  // a 4 GB machine: the memory rule is exercised too
  } catch (const ty::BadInput&) {
    // the user's exit 2
  } catch (const std::exception& e) {
    std::fprintf(stderr, "finding: an input ended in %s instead of BadInput\n", e.what());
    std::abort();
  }
  return 0;
}
