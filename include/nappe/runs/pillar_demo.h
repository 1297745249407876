#pragma once

namespace nappe
{
  /**
   * The case file (text) of nappe-solve's demo, a scenario of our own: a MoS2 monolayer transferred onto a
   * square array of rounded SiO2 nanopillars (pitch 100 nm, height 8 nm, radius 20 nm) — does it tent between
   * the pillars? Also the pillar cell of the multilevel benchmark.
   */
  const char *pillar_demo_case();
} // namespace nappe
