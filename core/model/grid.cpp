#include "core/model/grid.h"

#include <algorithm>

namespace tl {
namespace {

using Row = std::vector<GridEntry>;

Row::iterator lowerBound(Row& row, std::size_t c)
{
    return std::lower_bound(row.begin(), row.end(), c, [](const GridEntry& e, std::size_t col) { return e.col < col; });
}

Row::const_iterator lowerBound(const Row& row, std::size_t c)
{
    return std::lower_bound(row.begin(), row.end(), c, [](const GridEntry& e, std::size_t col) { return e.col < col; });
}

}  // namespace

double Grid::operator()(std::size_t r, std::size_t c) const
{
    const Row& row = rows_[r];
    const auto it = lowerBound(row, c);
    return it != row.end() && it->col == c ? it->value : 0.0;
}

void Grid::set(std::size_t r, std::size_t c, double v)
{
    Row& row = rows_[r];
    const auto it = lowerBound(row, c);
    const bool present = it != row.end() && it->col == c;
    if (v == 0.0) {
        if (present) {
            row.erase(it);
            --nonZeros_;
        }
    } else if (present) {
        it->value = v;
    } else {
        row.insert(it, GridEntry{c, v});
        ++nonZeros_;
    }
}

void Grid::insertRow(std::size_t at)
{
    rows_.insert(rows_.begin() + static_cast<std::ptrdiff_t>(at), Row{});
}

void Grid::removeRow(std::size_t at)
{
    nonZeros_ -= rows_[at].size();
    rows_.erase(rows_.begin() + static_cast<std::ptrdiff_t>(at));
}

void Grid::insertColumn(std::size_t at)
{
    if (at < cols_)
        for (Row& row : rows_)
            for (auto it = lowerBound(row, at); it != row.end(); ++it) ++it->col;
    ++cols_;
}

void Grid::removeColumn(std::size_t at)
{
    for (Row& row : rows_) {
        auto it = lowerBound(row, at);
        if (it != row.end() && it->col == at) {
            it = row.erase(it);
            --nonZeros_;
        }
        for (; it != row.end(); ++it) --it->col;
    }
    --cols_;
}

void Grid::moveRow(std::size_t from, std::size_t to)
{
    if (from == to) return;
    Row moved = std::move(rows_[from]);
    rows_.erase(rows_.begin() + static_cast<std::ptrdiff_t>(from));
    rows_.insert(rows_.begin() + static_cast<std::ptrdiff_t>(to), std::move(moved));
}

void Grid::moveColumn(std::size_t from, std::size_t to)
{
    if (from == to) return;
    // Column `from` lands at `to`; the columns between shift by one towards `from`.
    const std::size_t lo = std::min(from, to), hi = std::max(from, to);
    for (Row& row : rows_) {
        const auto first = lowerBound(row, lo);
        const auto last = lowerBound(row, hi + 1);
        if (first == last) continue;
        for (auto it = first; it != last; ++it) {
            if (it->col == from) it->col = to;
            else if (from < to) --it->col;
            else ++it->col;
        }
        // Only the moved entry is out of place: rotate it to its end of the range.
        if (from < to) std::rotate(first, first + (first->col == to ? 1 : 0), last);
        else std::rotate(first, last - (std::prev(last)->col == to ? 1 : 0), last);
    }
}

double Grid::rowSum(std::size_t r) const
{
    double sum = 0.0;
    for (const GridEntry& e : rows_[r]) sum += e.value;
    return sum;
}

}  // namespace tl
