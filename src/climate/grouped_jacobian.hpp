#pragma once
// Private to climate: a Jacobian of layer heating rates from few radiative calls, by perturbing
// groups of layers together (grouped finite differences, Curtis, Powell & Reid 1974, J. Inst.
// Math. Appl. 13, 117-119; from memory).
//
// The Jacobian of heating rates is not banded (radiative exchange reaches every layer), but it is
// a band plus a background that varies slowly from column to column: a row i has large entries
// for the layers next to layer i and small ones of one sign, changing slowly with j, beyond them.
// Layer j is put in group j mod G with G = 2b + 2 groups (b = half bandwidth): each layer of the
// band |i - j| <= b of row i is then the only one of its group in that band, and at least one
// group has no layer in it. The response of such a group, per layer (or per unit of a layer
// weight, such as the square root of its mass), measures the row's background; a band entry is its
// group's response less the background of the group's other layers. Each row keeps its exact sum
// over the layers of every group; what is lost is how the background varies across the column
// beyond the weights, which Broyden's updates then correct. (Attributing a
// group's whole response to its band layer instead, as for a truly banded matrix, can turn the
// diagonal's sign: in the upper layers the band and the background nearly cancel.)
#include <cstddef>
#include <vector>

#include <Eigen/Dense>

namespace bandstack::climate::detail {

// Number of groups for `layer_count` layers and half bandwidth b: min(2b + 2, layer_count).
[[nodiscard]] std::size_t jacobian_group_count(std::size_t layer_count, std::size_t half_bandwidth);

// The layers of group g (0 <= g < group_count): g, g + group_count, ... below layer_count.
[[nodiscard]] std::vector<std::size_t> jacobian_group(std::size_t g, std::size_t group_count, std::size_t layer_count);

// Assembles the (N+1) x (N+1) Jacobian d(H_0 .. H_{N-1}, surface net)/d(T_0 .. T_{N-1}, T_s) from
// group_response[g] = d(full response)/d(temperature of all layers of group g), N+1 values each,
// and the exact surface column. Row N (the surface) is placed below layer N-1 for the band test.
// far_weight (N values > 0, any unit; empty: all 1) shapes the background: row i's entry for a far
// layer j is c_i far_weight[j] instead of c_i, with c_i measured from the groups with no layer in
// the band, and a far group's response is shared among its layers in proportion to their weights.
// With group_count == layer_count the result is the ordinary forward-difference Jacobian.
[[nodiscard]] Eigen::MatrixXd assemble_grouped_jacobian(const std::vector<Eigen::VectorXd>& group_response,
                                                        const Eigen::VectorXd& surface_response,
                                                        std::size_t half_bandwidth,
                                                        const std::vector<double>& far_weight = {});

} // namespace bandstack::climate::detail
