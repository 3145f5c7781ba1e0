/// \file diagnostics.cpp
/// \brief Formatting and collection of input errors.
#include "io/scene/diagnostics.h"

#include <fmt/format.h>

namespace ty {

std::string Diagnostic::text() const {
  if (where.line > 0) return fmt::format("{}:{}:{}: error: {}", where.file, where.line, where.column, message);
  if (!where.file.empty()) return fmt::format("{}: error: {}", where.file, message);
  return fmt::format("error: {}", message);
}

void Diagnostics::error(const Mark& where, std::string message) { errors_.push_back({where, std::move(message)}); }

void Diagnostics::throw_if_any() const {
  if (errors_.empty()) return;
  std::string all;
  for (const auto& e : errors_) all += e.text() + "\n";
  all += fmt::format("{} error{} in the input; nothing was run.", errors_.size(), errors_.size() == 1 ? "" : "s");
  throw BadInput(all);
}

}  // namespace ty
