// ParamSet: the bit-mask set of parameters the balance sheet marks as solved.
#include <algorithm>
#include <vector>

#include <gtest/gtest.h>

#include "core/model/param_set.h"

namespace tl {
namespace {

TEST(ParamSet, IteratesItsMembersInParamOrderWhateverTheInsertionOrder)
{
    ParamSet s;
    EXPECT_TRUE(s.empty());
    EXPECT_EQ(s.size(), 0u);
    EXPECT_EQ(s.begin(), s.end());
    s.insert(Param::EE);
    s.insert(Param::Biomass);
    s.insert(Param::DetritusImport);
    s.insert(Param::EE);  // once only
    EXPECT_EQ(s.size(), 3u);
    EXPECT_EQ(std::vector<Param>(s.begin(), s.end()),
              (std::vector<Param>{Param::Biomass, Param::EE, Param::DetritusImport}));
    EXPECT_TRUE(s.contains(Param::Biomass));
    EXPECT_FALSE(s.contains(Param::PB));
    EXPECT_NE(std::find(s.begin(), s.end(), Param::EE), s.end());
    EXPECT_EQ(std::find(s.begin(), s.end(), Param::QB), s.end());
}

TEST(ParamSet, EqualityIsMembership)
{
    EXPECT_EQ((ParamSet{Param::QB, Param::PB}), (ParamSet{Param::PB, Param::QB}));
    EXPECT_NE((ParamSet{Param::PB}), (ParamSet{Param::PB, Param::QB}));
    EXPECT_EQ(ParamSet{}, ParamSet());
    for (Param p : kAllParams) {
        const ParamSet one{p};
        EXPECT_EQ(one.size(), 1u);
        EXPECT_EQ(*one.begin(), p);
    }
}

}  // namespace
}  // namespace tl
