// ParamSet: a set of Params kept as one bit mask, iterated in Param order. The balance
// sheet marks which values the solver supplied with it on every row; a bit mask costs
// no heap allocation, where a vector per row was most of the allocations of a small solve.
#pragma once

#include <bit>
#include <cstddef>
#include <cstdint>
#include <initializer_list>
#include <iterator>

#include "core/model/compartment.h"

namespace tl {

class ParamSet {
public:
    // Forward iteration over the members in ascending Param order (std::find, range-for).
    class const_iterator {
    public:
        using iterator_category = std::forward_iterator_tag;
        using value_type = Param;
        using difference_type = std::ptrdiff_t;
        using pointer = const Param*;
        using reference = Param;

        constexpr const_iterator() = default;
        constexpr Param operator*() const { return static_cast<Param>(std::countr_zero(rest_)); }
        constexpr const_iterator& operator++()
        {
            rest_ &= static_cast<std::uint16_t>(rest_ - 1u);  // drop the lowest member
            return *this;
        }
        constexpr const_iterator operator++(int)
        {
            const_iterator before = *this;
            ++*this;
            return before;
        }
        constexpr bool operator==(const const_iterator&) const = default;

    private:
        friend class ParamSet;
        constexpr explicit const_iterator(std::uint16_t rest) : rest_(rest) {}
        std::uint16_t rest_ = 0;  // members not yet visited
    };
    using iterator = const_iterator;
    using value_type = Param;

    constexpr ParamSet() = default;
    constexpr ParamSet(std::initializer_list<Param> params)
    {
        for (Param p : params) insert(p);
    }

    constexpr void insert(Param p) { bits_ = static_cast<std::uint16_t>(bits_ | bit(p)); }
    constexpr bool contains(Param p) const { return (bits_ & bit(p)) != 0; }
    constexpr bool empty() const { return bits_ == 0; }
    constexpr std::size_t size() const
    {
        std::size_t count = 0;  // a loop over the few members: std::popcount may be a library call
        for (std::uint16_t rest = bits_; rest != 0; rest &= static_cast<std::uint16_t>(rest - 1u)) ++count;
        return count;
    }
    constexpr const_iterator begin() const { return const_iterator(bits_); }
    constexpr const_iterator end() const { return const_iterator(0); }
    constexpr bool operator==(const ParamSet&) const = default;

private:
    static_assert(kParamCount <= 16, "ParamSet holds at most 16 parameters");
    static constexpr std::uint16_t bit(Param p) { return static_cast<std::uint16_t>(1u << static_cast<unsigned>(p)); }
    std::uint16_t bits_ = 0;
};

}  // namespace tl
