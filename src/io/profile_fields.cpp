// Reading one variable of a profile file: shape, units, values (docs/profile-file.md).
#include "io/profile_fields.hpp"

#include "bandstack/core/error.hpp"
#include "bandstack/thermo/humidity.hpp"
#include "io/profile_units.hpp"

#include <algorithm>
#include <fmt/format.h>

namespace bandstack::io::detail {

namespace {

[[noreturn]] void fail(const NetcdfFile& nc, const Source& source, const std::string& message) {
  InputPlace place;
  place.file = nc.path();
  place.item = source.name;
  throw InputError(place, message);
}

bool is_gas(Quantity q) { return q >= Quantity::h2o; }

bool mass_based(AmountKind k) {
  return k == AmountKind::mass_fraction || k == AmountKind::specific_humidity || k == AmountKind::mixing_ratio;
}

const char* kind_text(AmountKind k) {
  switch (k) {
  case AmountKind::mole_fraction:
    return "mole fraction";
  case AmountKind::mass_fraction:
    return "mass fraction";
  case AmountKind::specific_humidity:
    return "specific humidity";
  case AmountKind::mixing_ratio:
    return "mass mixing ratio";
  case AmountKind::none:
    break;
  }
  return "";
}

// The allowed dimension lists for `q`, as positions into layout.dims.
std::vector<std::vector<std::size_t>> allowed_shapes(Quantity q, const Layout& layout) {
  std::vector<std::size_t> full(layout.dims.size());
  for (std::size_t j = 0; j < full.size(); ++j)
    full[j] = j;
  const std::vector<std::size_t> vertical{layout.vertical};
  switch (q) {
  case Quantity::temperature:
    return {full};
  case Quantity::pressure:
    return {full, vertical};
  case Quantity::surface_temperature:
  case Quantity::surface_pressure:
    return {layout.leading, {}};
  default:
    return {full, vertical, layout.leading, {}};
  }
}

// The variable's dimensions as positions into layout.dims: one of the allowed shapes.
std::vector<std::size_t> matching_shape(const NetcdfFile& nc, Quantity q, const Source& source, const Layout& layout) {
  const std::vector<int> dims = nc.dimensions(source.varid);
  std::string expected;
  std::vector<std::vector<int>> tried;
  for (const std::vector<std::size_t>& shape : allowed_shapes(q, layout)) {
    std::vector<int> want;
    for (std::size_t j : shape)
      want.push_back(layout.dims[j]);
    if (dims == want) return shape;
    if (std::find(tried.begin(), tried.end(), want) != tried.end())
      continue; // e.g. () twice without leading dimensions
    tried.push_back(want);
    expected += (expected.empty() ? "" : " or ") + nc.describe_dimensions(want);
  }
  fail(nc, source,
       fmt::format("dimensions {} do not fit {}: expected {}", nc.describe_dimensions(dims), quantity_name(q),
                   expected));
}

// The amount's kind from its standard_name and units; the factor to kg/kg or mol/mol.
double amount_kind(const NetcdfFile& nc, Quantity q, const Source& source, const std::string& units, AmountKind& kind) {
  const auto u = amount_units(units);
  if (!u)
    fail(
        nc, source,
        fmt::format("units \"{}\" not accepted for {} (accepted: {})", units, quantity_name(q), accepted_amount_units));
  if (source.standard_name) {
    kind = source.standard_name->kind;
    if ((u->basis == AmountBasis::mole && mass_based(kind)) || (u->basis == AmountBasis::mass && !mass_based(kind)))
      fail(nc, source,
           fmt::format("units \"{}\" are {} based, but standard_name '{}' is {} based", units,
                       u->basis == AmountBasis::mole ? "mole" : "mass", source.standard_name->name,
                       mass_based(kind) ? "mass" : "mole"));
  } else if (u->basis == AmountBasis::either) {
    fail(nc, source,
         fmt::format("units \"{}\" do not say whether the {} amount is per mass or per mole: add a "
                     "standard_name or write units \"kg kg-1\" (mass) or \"mol mol-1\" (mole)",
                     units, quantity_name(q)));
  } else if (u->basis == AmountBasis::mass) {
    kind = q == Quantity::h2o ? AmountKind::specific_humidity : AmountKind::mass_fraction;
  } else {
    kind = AmountKind::mole_fraction;
  }
  return u->factor;
}

// Converts the values to SI (water to mole fraction) and checks their range; messages give the value
// as the file has it.
void convert_values(const NetcdfFile& nc, Quantity q, const UnitConversion& conversion, const std::vector<std::size_t>& start,
                    const std::vector<std::size_t>& count, Field& field) {
  for (std::size_t i = 0; i < field.values.size(); ++i) {
    double& v = field.values[i];
    const double in_file = v;
    const auto bad = [&](const char* rule) {
      fail(nc, field.source,
           fmt::format("value {} {} at {}: {}", in_file, field.units, nc.describe_index(field.source.varid, i, start, count), rule));
    };
    v = conversion.apply(v);
    if (!is_gas(q)) {
      if (!(v > 0.0))
        bad(q == Quantity::temperature || q == Quantity::surface_temperature ? "must be above 0 K" : "must be > 0");
    } else if (field.kind == AmountKind::mixing_ratio) {
      if (!(v >= 0.0)) bad("must be >= 0");
      v = thermo::mole_fraction_from_mass_mixing_ratio(v);
    } else {
      if (!(v >= 0.0 && v < 1.0))
        bad(field.kind == AmountKind::mole_fraction ? "a mole fraction must be in [0, 1)"
                                                    : "a mass fraction must be in [0, 1)");
      if (field.kind == AmountKind::specific_humidity) v = thermo::mole_fraction_from_specific_humidity(v);
    }
  }
}

} // namespace

std::size_t Field::column_offset(const Layout& layout, const std::vector<std::size_t>& index) const {
  std::size_t offset = 0;
  for (std::size_t j = 0; j < layout.leading.size(); ++j) {
    const std::size_t d = layout.leading[j];
    if (stride[d] != 0) offset += (index[j] - origin[d]) * stride[d];
  }
  return offset;
}

FieldPlan plan_field(const NetcdfFile& nc, Quantity q, const Source& source, const Layout& layout) {
  FieldPlan plan;
  plan.source = source;
  plan.shape = matching_shape(nc, q, source, layout);

  const bool pressure = q == Quantity::pressure || q == Quantity::surface_pressure;
  const bool temperature = q == Quantity::temperature || q == Quantity::surface_temperature;
  const char* accepted = pressure      ? accepted_pressure_units
                         : temperature ? accepted_temperature_units
                                       : accepted_amount_units;
  const auto units = nc.text_attribute(source.varid, "units");
  if (!units) fail(nc, source, fmt::format("missing 'units' attribute (accepted: {})", accepted));
  plan.units = *units;
  if (pressure || temperature) {
    const auto c = pressure ? pressure_units(*units) : temperature_units(*units);
    if (!c)
      fail(nc, source,
           fmt::format("units \"{}\" not accepted for {} (accepted: {})", *units, quantity_name(q), accepted));
    plan.conversion = *c;
  } else {
    plan.conversion.factor = amount_kind(nc, q, source, *units, plan.kind);
  }
  return plan;
}

Field read_field(const NetcdfFile& nc, Quantity q, const FieldPlan& plan, const Layout& layout, const Hyperslab& box) {
  Field field;
  field.source = plan.source;
  field.units = plan.units;
  field.kind = plan.kind;
  field.stride.assign(layout.dims.size(), 0);
  field.origin.assign(layout.dims.size(), 0);
  std::vector<std::size_t> start, count;
  for (std::size_t d : plan.shape) {
    start.push_back(box.start[d]);
    count.push_back(box.count[d]);
    field.origin[d] = box.start[d];
  }
  std::size_t s = 1;
  for (std::size_t k = plan.shape.size(); k-- > 0;) {
    field.stride[plan.shape[k]] = s;
    s *= count[k];
  }
  field.values = nc.read_values(plan.source.varid, start, count);
  convert_values(nc, q, plan.conversion, start, count, field);
  return field;
}

std::string describe_use(Quantity q, const FieldPlan& field) {
  if (field.kind == AmountKind::none)
    return fmt::format("{} <- {} ({})", quantity_name(q), field.source.name, field.units);
  return fmt::format("{} <- {} ({}, {})", quantity_name(q), field.source.name, field.units, kind_text(field.kind));
}

} // namespace bandstack::io::detail
