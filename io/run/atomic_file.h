/// \file atomic_file.h
/// \brief The one way terayee puts a finished file in place: it is written under
/// NAME.tmp in the same folder, flushed to the disk (fsync), renamed over NAME, and the
/// folder is flushed too. rename(2) replaces a name atomically within one file system
/// (POSIX.1-2017, rename), so NAME always holds either the old complete file or the new
/// one, also after a kill -9 or a power cut (the fsyncs order the data before the name).
#pragma once
#include <functional>
#include <string>

namespace ty {

/// The temporary name of `path`: `path` + ".tmp", in the same folder.
std::string temporary_name(const std::string& path);

/// Flushes `tmp` to the disk, renames it to `path` and flushes the folder. Throws
/// std::runtime_error (naming `path` and the system's reason) on any failure; `tmp` is
/// then removed and `path` is left as it was.
void commit_file(const std::string& tmp, const std::string& path);

/// Calls `write` with the temporary name, then commits it. When `write` throws, the
/// temporary file is removed and the exception goes on; `path` is untouched.
void write_atomically(const std::string& path, const std::function<void(const std::string& tmp)>& write);

/// Writes `text` as the whole of `path`, atomically (for JSON, CSV, YAML and XML files).
void write_text_atomically(const std::string& path, const std::string& text);

/// Removes a left-over temporary file (no error when there is none).
void discard_temporary(const std::string& tmp);

}  // namespace ty
