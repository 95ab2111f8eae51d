// Student's t quantiles against the printed two-sided 95 % and 99 % table values
// (any statistics table, e.g. Sokal & Rohlf, Biometry, Table 12; common practice) and
// the normal limit. scipy.stats.t.ppf is compared on fractional df in
// tests/crosscheck/fieldwork_crosscheck_test.cpp.
#include <gtest/gtest.h>

#include <cmath>

#include "core/fieldwork/student_t.h"

namespace tl::fieldwork {
namespace {

TEST(StudentT, TableValues)
{
    EXPECT_NEAR(studentTQuantile(0.975, 1), 12.7062, 1e-4);
    EXPECT_NEAR(studentTQuantile(0.975, 2), 4.3027, 1e-4);
    EXPECT_NEAR(studentTQuantile(0.975, 3), 3.1824, 1e-4);
    EXPECT_NEAR(studentTQuantile(0.975, 10), 2.2281, 1e-4);
    EXPECT_NEAR(studentTQuantile(0.975, 30), 2.0423, 1e-4);
    EXPECT_NEAR(studentTQuantile(0.995, 5), 4.0321, 1e-4);
    EXPECT_NEAR(studentTTwoSided(0.95, 1e7), 1.959964, 1e-5);  // the normal quantile
}

TEST(StudentT, CdfAndQuantileInvertEachOther)
{
    for (double df : {0.7, 1.0, 2.39, 5.0, 40.0})
        for (double p : {0.01, 0.2, 0.5, 0.9, 0.999}) {
            const double t = studentTQuantile(p, df);
            EXPECT_NEAR(studentTCdf(t, df), p, 1e-10) << "df " << df << " p " << p;
            EXPECT_NEAR(studentTQuantile(1.0 - p, df), -t, 1e-9);
        }
    EXPECT_TRUE(std::isnan(studentTQuantile(0.0, 3)));
    EXPECT_TRUE(std::isnan(studentTQuantile(0.5, 0)));
}

}  // namespace
}  // namespace tl::fieldwork
