/// \file diagnostics.h
/// \brief Input errors with their place in the file (file:line:col), collected so that
/// every error of a scene is reported at once, and the exception that carries them.
#pragma once
#include <stdexcept>
#include <string>
#include <vector>

namespace ty {

/// A place in an input file; line and column count from 1 (0 = unknown).
struct Mark {
  std::string file;
  int line = 0;
  int column = 0;
};

struct Diagnostic {
  Mark where;
  std::string message;
  std::string text() const;  ///< "file:line:col: error: message"
};

/// Collects errors while a scene is read; `throw_if_any` turns them into one BadInput.
class Diagnostics {
 public:
  void error(const Mark& where, std::string message);
  bool empty() const { return errors_.empty(); }
  const std::vector<Diagnostic>& errors() const { return errors_; }
  void throw_if_any() const;

 private:
  std::vector<Diagnostic> errors_;
};

/// Bad input or usage: the program reports `what()` and exits with status 2.
class BadInput : public std::runtime_error {
 public:
  explicit BadInput(const std::string& message) : std::runtime_error(message) {}
};

}  // namespace ty
