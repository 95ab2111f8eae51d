// Grid: a dense row-major matrix of doubles whose rows and columns can be inserted
// and removed, so that compartment-indexed tables (diet, routing) follow edits of the
// compartment list. Deliberately tiny; numerical work uses Eigen.
#pragma once

#include <cstddef>
#include <vector>

namespace tl {

class Grid {
public:
    Grid() = default;
    Grid(std::size_t rows, std::size_t cols, double fill = 0.0) : rows_(rows), cols_(cols), v_(rows * cols, fill) {}

    std::size_t rows() const { return rows_; }
    std::size_t cols() const { return cols_; }
    double operator()(std::size_t r, std::size_t c) const { return v_[r * cols_ + c]; }
    double& operator()(std::size_t r, std::size_t c) { return v_[r * cols_ + c]; }
    const double* rowData(std::size_t r) const { return v_.data() + r * cols_; }

    void insertRow(std::size_t at, double fill = 0.0);
    void removeRow(std::size_t at);
    void insertColumn(std::size_t at, double fill = 0.0);
    void removeColumn(std::size_t at);
    void moveRow(std::size_t from, std::size_t to);
    void moveColumn(std::size_t from, std::size_t to);
    double rowSum(std::size_t r) const;

    bool operator==(const Grid&) const = default;

private:
    std::size_t rows_ = 0, cols_ = 0;
    std::vector<double> v_;
};

}  // namespace tl
