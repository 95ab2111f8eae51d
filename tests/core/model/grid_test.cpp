// Sparse Grid against a plain dense reference (vector of rows): every structural edit is
// applied to both and the two must agree cell by cell, with zeros never stored.
#include "core/model/grid.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <random>
#include <vector>

namespace tl {
namespace {

using Dense = std::vector<std::vector<double>>;

Dense denseOf(const Grid& g)
{
    Dense d(g.rows(), std::vector<double>(g.cols(), 0.0));
    for (std::size_t r = 0; r < g.rows(); ++r)
        for (const GridEntry& e : g.row(r)) d[r][e.col] = e.value;
    return d;
}

// Checks values, column order within rows, no stored zeros and the entry count.
void expectMatches(const Grid& g, const Dense& d)
{
    ASSERT_EQ(g.rows(), d.size());
    std::size_t nonZeros = 0;
    for (std::size_t r = 0; r < d.size(); ++r) {
        ASSERT_EQ(g.cols(), d[r].size());
        const auto row = g.row(r);
        for (std::size_t k = 0; k < row.size(); ++k) {
            EXPECT_NE(row[k].value, 0.0) << "row " << r;
            EXPECT_LT(row[k].col, g.cols());
            if (k > 0) {
                EXPECT_LT(row[k - 1].col, row[k].col) << "row " << r << " not sorted";
            }
        }
        for (std::size_t c = 0; c < d[r].size(); ++c) {
            EXPECT_EQ(g(r, c), d[r][c]) << "cell " << r << "," << c;
            if (d[r][c] != 0.0) ++nonZeros;
        }
    }
    EXPECT_EQ(g.nonZeros(), nonZeros);
}

// A 4 x 5 grid with a few entries, and the same as a dense table.
void sample(Grid& g, Dense& d)
{
    g = Grid(4, 5);
    d.assign(4, std::vector<double>(5, 0.0));
    const double cells[][3] = {{0, 1, 0.5}, {0, 4, 0.5}, {1, 0, 1.0}, {2, 2, 0.3}, {2, 3, 0.7}, {3, 0, 0.2}, {3, 4, 0.8}};
    for (const auto& c : cells) {
        g.set(std::size_t(c[0]), std::size_t(c[1]), c[2]);
        d[std::size_t(c[0])][std::size_t(c[1])] = c[2];
    }
}

TEST(Grid, SetGetAndZeroErases)
{
    Grid g(2, 3);
    EXPECT_EQ(g.nonZeros(), 0u);
    EXPECT_EQ(g(1, 2), 0.0);
    g.set(1, 2, 0.4);
    g.set(1, 0, 0.6);
    ASSERT_EQ(g.row(1).size(), 2u);
    EXPECT_EQ(g.row(1)[0], (GridEntry{0, 0.6}));
    EXPECT_EQ(g.row(1)[1], (GridEntry{2, 0.4}));
    EXPECT_DOUBLE_EQ(g.rowSum(1), 1.0);
    g.set(1, 2, 0.25);  // overwrite keeps one entry
    EXPECT_EQ(g.nonZeros(), 2u);
    EXPECT_EQ(g(1, 2), 0.25);
    g.set(1, 2, 0.0);
    EXPECT_EQ(g.nonZeros(), 1u);
    EXPECT_EQ(g.row(1).size(), 1u);
    g.set(0, 1, 0.0);  // erasing an absent cell stores nothing
    EXPECT_EQ(g.nonZeros(), 1u);
    EXPECT_TRUE(g.row(0).empty());
}

TEST(Grid, EqualityIgnoresHowZerosCameAbout)
{
    Grid a(3, 3), b(3, 3);
    a.set(0, 1, 0.5);
    b.set(0, 1, 0.5);
    b.set(2, 2, 0.9);
    EXPECT_NE(a, b);
    b.set(2, 2, 0.0);
    EXPECT_EQ(a, b);
    b.set(0, 1, 0.4);
    EXPECT_NE(a, b);
    EXPECT_NE(Grid(3, 3), Grid(3, 4));
}

TEST(Grid, InsertAndRemoveRowsAgreeWithDense)
{
    for (std::size_t at = 0; at <= 4; ++at) {
        Grid g;
        Dense d;
        sample(g, d);
        g.insertRow(at);
        d.insert(d.begin() + std::ptrdiff_t(at), std::vector<double>(5, 0.0));
        expectMatches(g, d);
        g.removeRow(at);
        d.erase(d.begin() + std::ptrdiff_t(at));
        expectMatches(g, d);
        if (at < 4) {
            g.removeRow(at);
            d.erase(d.begin() + std::ptrdiff_t(at));
            expectMatches(g, d);
        }
    }
}

TEST(Grid, InsertAndRemoveColumnsAgreeWithDense)
{
    for (std::size_t at = 0; at <= 5; ++at) {
        Grid g;
        Dense d;
        sample(g, d);
        g.insertColumn(at);
        for (auto& row : d) row.insert(row.begin() + std::ptrdiff_t(at), 0.0);
        expectMatches(g, d);
        if (at < 5) {
            g.removeColumn(at + 1);  // an original column, holding entries in some rows
            for (auto& row : d) row.erase(row.begin() + std::ptrdiff_t(at + 1));
            expectMatches(g, d);
        }
    }
}

TEST(Grid, MoveRowsAndColumnsAgreeWithDense)
{
    for (std::size_t from = 0; from < 5; ++from)
        for (std::size_t to = 0; to < 5; ++to) {
            Grid g;
            Dense d;
            sample(g, d);
            g.moveColumn(from, to);
            for (auto& row : d) {
                const double v = row[from];
                row.erase(row.begin() + std::ptrdiff_t(from));
                row.insert(row.begin() + std::ptrdiff_t(to), v);
            }
            expectMatches(g, d);
            if (from < 4 && to < 4) {
                g.moveRow(from, to);
                auto moved = d[from];
                d.erase(d.begin() + std::ptrdiff_t(from));
                d.insert(d.begin() + std::ptrdiff_t(to), moved);
                expectMatches(g, d);
            }
        }
}

// Random edits on a larger grid, checked after each step.
TEST(Grid, RandomEditSequenceAgreesWithDense)
{
    std::mt19937 rng(20261202);
    Grid g(6, 6);
    Dense d(6, std::vector<double>(6, 0.0));
    auto pick = [&](std::size_t n) { return std::uniform_int_distribution<std::size_t>(0, n - 1)(rng); };
    for (int step = 0; step < 400; ++step) {
        const std::size_t rows = d.size(), cols = d.empty() ? 0 : d[0].size();
        switch (pick(8)) {
        case 0:
        case 1:
            if (rows && cols) {
                const std::size_t r = pick(rows), c = pick(cols);
                const double v = pick(3) == 0 ? 0.0 : double(pick(9) + 1) / 10.0;
                g.set(r, c, v);
                d[r][c] = v;
            }
            break;
        case 2: {
            const std::size_t at = pick(rows + 1);
            g.insertRow(at);
            d.insert(d.begin() + std::ptrdiff_t(at), std::vector<double>(cols, 0.0));
            break;
        }
        case 3:
            if (rows > 1) {
                const std::size_t at = pick(rows);
                g.removeRow(at);
                d.erase(d.begin() + std::ptrdiff_t(at));
            }
            break;
        case 4: {
            const std::size_t at = pick(cols + 1);
            g.insertColumn(at);
            for (auto& row : d) row.insert(row.begin() + std::ptrdiff_t(at), 0.0);
            break;
        }
        case 5:
            if (cols > 1) {
                const std::size_t at = pick(cols);
                g.removeColumn(at);
                for (auto& row : d) row.erase(row.begin() + std::ptrdiff_t(at));
            }
            break;
        case 6:
            if (rows) {
                const std::size_t from = pick(rows), to = pick(rows);
                g.moveRow(from, to);
                auto moved = d[from];
                d.erase(d.begin() + std::ptrdiff_t(from));
                d.insert(d.begin() + std::ptrdiff_t(to), moved);
            }
            break;
        case 7:
            if (cols) {
                const std::size_t from = pick(cols), to = pick(cols);
                g.moveColumn(from, to);
                for (auto& row : d) {
                    const double v = row[from];
                    row.erase(row.begin() + std::ptrdiff_t(from));
                    row.insert(row.begin() + std::ptrdiff_t(to), v);
                }
            }
            break;
        }
        if (!d.empty()) expectMatches(g, d);
        EXPECT_EQ(denseOf(g), d) << "step " << step;
        if (HasFailure()) return;
    }
}

TEST(Grid, AppendingAColumnLeavesRowsUntouched)
{
    Grid g;
    Dense d;
    sample(g, d);
    const auto before = g.row(0).data();
    g.insertColumn(g.cols());
    EXPECT_EQ(g.cols(), 6u);
    EXPECT_EQ(g.row(0).data(), before);  // no row reallocated
    EXPECT_EQ(g(0, 4), 0.5);
    EXPECT_EQ(g(0, 5), 0.0);
}

}  // namespace
}  // namespace tl
