using System.Text.Json.Serialization;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Export;
using VoxProf.Reports.Html;
using VoxProf.Reports.Shards;
using VoxProf.Reports.Views;

namespace VoxProf.Reports.Model;

/// <summary>
/// The JSON contracts of every document the reports write or read, generated at build time. Every serialiser option
/// set of the reports resolves its types here and nowhere else, so a run builds no contract by reflection (which
/// compiled a converter for every built-in type and emitted accessors): `compare` took 0.45 s instead of 0.50, a small
/// trace about 0.03 s less (docs/performance.md, "Around the kernels"). The options keep deciding names, indentation
/// and escaping, so the files are byte for byte what reflection wrote. A document type missing here fails at its
/// first use (NotSupportedException), in the tests that write and read it.
/// </summary>
[JsonSerializable(typeof(ReportDocument))]
[JsonSerializable(typeof(RunDocument))]
[JsonSerializable(typeof(TileShardDocument))]
[JsonSerializable(typeof(CalibrationDocument))]
[JsonSerializable(typeof(CompareDocument))]
[JsonSerializable(typeof(ReportManifest))]
[JsonSerializable(typeof(PixelBlock.PageData))]
internal sealed partial class DocumentJson : JsonSerializerContext;
