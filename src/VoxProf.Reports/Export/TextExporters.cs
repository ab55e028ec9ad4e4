using VoxProf.Reports.Model;
using VoxProf.Reports.Tables;

namespace VoxProf.Reports.Export;

public sealed class ReportJsonExporter : IReportExporter
{
    public string Name => OutputNames.ReportJson;

    public void Export(ReportContext context, OutputDirectory output) =>
        output.WriteText(OutputNames.ReportJson, w => w.Write(ReportJson.Serialize(context.Document)));
}

public sealed class SummaryCsvExporter : IReportExporter
{
    public string Name => OutputNames.SummaryCsv;

    public void Export(ReportContext context, OutputDirectory output) =>
        output.WriteText(OutputNames.SummaryCsv, w => SummaryCsv.Write(MetricTable.FromReport(context.Document), w));
}

public sealed class SummaryMarkdownExporter : IReportExporter
{
    public string Name => OutputNames.SummaryMarkdown;

    public void Export(ReportContext context, OutputDirectory output) =>
        output.WriteText(OutputNames.SummaryMarkdown, w => w.Write(SummaryMarkdown.Render(context.Document, MetricTable.FromReport(context.Document), context.Options.LinkBase)));
}
