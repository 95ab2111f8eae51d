// Grid: a sparse matrix of doubles, one row of (column, value) entries sorted by column,
// zeros never stored. Rows and columns can be inserted, removed and moved so that
// compartment-indexed tables (diet, routing) follow edits of the compartment list.
// Sparse because real diets name 3-15 prey per predator: a 5000-compartment model holds
// tens of thousands of entries, not 25 million cells. Numerical work uses Eigen.
#pragma once

#include <cstddef>
#include <span>
#include <vector>

namespace tl {

struct GridEntry {
    std::size_t col;
    double value;
    bool operator==(const GridEntry&) const = default;
};

class Grid {
public:
    Grid() = default;
    Grid(std::size_t rows, std::size_t cols) : cols_(cols), rows_(rows) {}

    std::size_t rows() const { return rows_.size(); }
    std::size_t cols() const { return cols_; }
    // 0 when the cell holds no entry; O(log k) for a row of k entries.
    double operator()(std::size_t r, std::size_t c) const;
    // Setting 0 erases the entry, so equal grids hold equal entries.
    void set(std::size_t r, std::size_t c, double v);
    // The non-zero entries of row r, sorted by column.
    std::span<const GridEntry> row(std::size_t r) const { return rows_[r]; }
    std::size_t nonZeros() const { return nonZeros_; }

    void insertRow(std::size_t at);
    void reserveRows(std::size_t n) { rows_.reserve(n); }
    void removeRow(std::size_t at);
    // Appending (at == cols()) is O(1): no row is touched. Otherwise O(entries).
    void insertColumn(std::size_t at);
    void removeColumn(std::size_t at);
    void moveRow(std::size_t from, std::size_t to);
    void moveColumn(std::size_t from, std::size_t to);
    double rowSum(std::size_t r) const;

    bool operator==(const Grid&) const = default;

private:
    using Row = std::vector<GridEntry>;
    std::size_t cols_ = 0;
    std::size_t nonZeros_ = 0;
    std::vector<Row> rows_;
};

}  // namespace tl
