namespace VoxProf.Tests.Strategies;

/// <summary>The text of a strategy file as a user writes one, for tests that compile it.</summary>
internal static class StrategySource
{
    /// <summary>The usings a strategy file needs: three lines.</summary>
    public const string Usings = "using VoxProf.Core.Rays;\nusing VoxProf.Core.Strategies;\nusing VoxProf.Core.Traversal;\n";

    /// <summary>
    /// <see cref="Usings"/>, then a struct whose <c>Trace</c> runs <paramref name="body"/> (indented lines, from line 13
    /// of the file) between <c>TCounters counters = default;</c> and <c>return counters;</c>; <paramref name="members"/>
    /// is line 8.
    /// </summary>
    public static string Of(string type, string name, string body, string members = "") => Usings + Struct(type, name, body, members);

    /// <summary>The struct of <see cref="Of"/> alone, for a file that holds more than one.</summary>
    public static string Struct(string type, string name, string body, string members = "") => $$"""
        public struct {{type}} : IStrategy
        {
            public static string Name => "{{name}}";
            public static string Description => "test";
            {{members}}
            public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
                where TBranching : struct, IBranching where TCounters : struct, ICostCounters
            {
                TCounters counters = default;
        {{body}}
                return counters;
            }
        }

        """;
}
