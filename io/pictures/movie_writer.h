/// \file movie_writer.h
/// \brief An H.264 movie (MP4, yuv420p, even sizes: what presentation software plays) made by
/// piping raw BGRA frames to the ffmpeg program. The movie is written under a temporary name
/// and renamed when `finish()` succeeds; an abandoned movie leaves nothing behind.
#pragma once
#include <sys/types.h>

#include <cstdint>
#include <string>

namespace ty {

class MovieWriter {
 public:
  /// Starts ffmpeg; width and height must be even.
  MovieWriter(const std::string& path, int width, int height, double fps);
  ~MovieWriter();  ///< abandons the movie unless finished
  MovieWriter(const MovieWriter&) = delete;
  MovieWriter& operator=(const MovieWriter&) = delete;

  /// One frame of width x height BGRA pixels, `stride` bytes a row.
  void add(const uint8_t* bgra, int stride);
  /// Closes the pipe, waits for ffmpeg and renames the movie into place.
  void finish();
  long frames() const { return frames_; }

 private:
  void abandon();
  std::string path_, tmp_;
  int width_, height_;
  int pipe_ = -1;
  pid_t pid_ = -1;
  long frames_ = 0;
};

}  // namespace ty
