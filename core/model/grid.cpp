#include "core/model/grid.h"

#include <numeric>

namespace tl {

void Grid::insertRow(std::size_t at, double fill)
{
    v_.insert(v_.begin() + static_cast<std::ptrdiff_t>(at * cols_), cols_, fill);
    ++rows_;
}

void Grid::removeRow(std::size_t at)
{
    const auto first = v_.begin() + static_cast<std::ptrdiff_t>(at * cols_);
    v_.erase(first, first + static_cast<std::ptrdiff_t>(cols_));
    --rows_;
}

void Grid::insertColumn(std::size_t at, double fill)
{
    std::vector<double> out;
    out.reserve(rows_ * (cols_ + 1));
    for (std::size_t r = 0; r < rows_; ++r)
        for (std::size_t c = 0; c <= cols_; ++c)
            out.push_back(c == at ? fill : (*this)(r, c < at ? c : c - 1));
    v_ = std::move(out);
    ++cols_;
}

void Grid::removeColumn(std::size_t at)
{
    std::vector<double> out;
    out.reserve(rows_ * (cols_ - 1));
    for (std::size_t r = 0; r < rows_; ++r)
        for (std::size_t c = 0; c < cols_; ++c)
            if (c != at) out.push_back((*this)(r, c));
    v_ = std::move(out);
    --cols_;
}

void Grid::moveRow(std::size_t from, std::size_t to)
{
    if (from == to) return;
    std::vector<double> row(rowData(from), rowData(from) + cols_);
    removeRow(from);
    insertRow(to);
    std::copy(row.begin(), row.end(), v_.begin() + static_cast<std::ptrdiff_t>(to * cols_));
}

void Grid::moveColumn(std::size_t from, std::size_t to)
{
    if (from == to) return;
    std::vector<double> col(rows_);
    for (std::size_t r = 0; r < rows_; ++r) col[r] = (*this)(r, from);
    removeColumn(from);
    insertColumn(to);
    for (std::size_t r = 0; r < rows_; ++r) (*this)(r, to) = col[r];
}

double Grid::rowSum(std::size_t r) const
{
    return std::accumulate(rowData(r), rowData(r) + cols_, 0.0);
}

}  // namespace tl
