/// \file test_work_rows.cpp
/// \brief Cutting rows among threads by work (solver/threads/block_rows.h): contiguous,
/// covering every row once, each thread's work within one row of its equal share (the
/// greedy prefix cut of the linear partition problem; common practice).
#include <doctest/doctest.h>

#include <algorithm>
#include <vector>

#include "solver/threads/block_rows.h"

using namespace ty;

namespace {
std::vector<double> prefix(const std::vector<double>& cost) {
  std::vector<double> w(cost.size() + 1, 0.0);
  for (size_t j = 0; j < cost.size(); ++j) w[j + 1] = w[j] + cost[j];
  return w;
}
/// The work table of `rows` rows of 100 vacuum cells whose rows from `from` on also hold 100
/// magnetic cells at 5 more each (600 a row): a crystal over the upper rows.
std::vector<double> crystal_above(int rows, int from) {
  std::vector<double> cost(rows, 100.0);
  for (int j = from; j < rows; ++j) cost[j] = 600.0;
  return prefix(cost);
}
}  // namespace

TEST_CASE("work_rows: a crystal over the upper half moves the cut down to equal work") {
  const auto w = crystal_above(100, 50);
  int lo, hi;
  work_rows(w, 0, 100, 0, 2, lo, hi);
  CHECK(lo == 0);
  // half of 35000 is 17500: rows 0..49 give 5000, then 21 rows of 600 reach 17600
  CHECK(hi == 71);
  int lo1, hi1;
  work_rows(w, 0, 100, 1, 2, lo1, hi1);
  CHECK(lo1 == hi);
  CHECK(hi1 == 100);
  // the even cut (block_rows) would give thread 1 six times thread 0's work
  block_rows(100, 0, 2, lo, hi);
  CHECK(hi == 50);
}

TEST_CASE("work_rows: every thread count covers the rows once, in order, and balances to a row") {
  std::vector<double> cost;
  for (int j = 0; j < 337; ++j) cost.push_back(j % 7 == 0 ? 0.0 : 10.0 + (j * 37) % 91);
  const auto w = prefix(cost);
  const double biggest = *std::max_element(cost.begin(), cost.end());
  for (int nt = 1; nt <= 9; ++nt) {
    int next = 0;
    for (int t = 0; t < nt; ++t) {
      int lo, hi;
      work_rows(w, 0, 337, t, nt, lo, hi);
      CHECK(lo == next);
      CHECK(hi >= lo);
      const double share = w[337] / nt, got = w[hi] - w[lo];
      CHECK(got <= share + biggest);
      CHECK(got >= share - biggest);
      next = hi;
    }
    CHECK(next == 337);
  }
}

TEST_CASE("work_rows: no work table, or more threads than rows, still a valid cut") {
  int lo, hi;
  work_rows({}, 0, 10, 2, 3, lo, hi);  // falls back to block_rows
  int blo, bhi;
  block_rows(10, 2, 3, blo, bhi);
  CHECK(lo == blo);
  CHECK(hi == bhi);
  const std::vector<double> w = {0, 1, 2, 3};  // 3 rows, 7 threads: some threads idle
  int next = 0;
  for (int t = 0; t < 7; ++t) {
    work_rows(w, 0, 3, t, 7, lo, hi);
    CHECK(lo == next);
    CHECK(hi >= lo);
    next = hi;
  }
  CHECK(next == 3);
}

TEST_CASE("work_rows: the rows of one rank are cut by their own work") {
  const auto w = crystal_above(60, 40);
  // rows 20 .. 59 of a rank: 20 x 100 + 20 x 600 = 14000, half 7000: rows 20..39 give 2000,
  // then 9 rows of 600 reach 7400
  int lo, hi;
  work_rows(w, 20, 60, 0, 2, lo, hi);
  CHECK(lo == 20);
  CHECK(hi == 49);
  work_rows(w, 20, 60, 1, 2, lo, hi);
  CHECK(lo == 49);
  CHECK(hi == 60);
  work_rows({}, 20, 60, 1, 2, lo, hi);  // no table: equal rows of the range
  CHECK(lo == 40);
  CHECK(hi == 60);
}
