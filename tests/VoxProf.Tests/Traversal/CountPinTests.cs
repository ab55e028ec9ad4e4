using System.Globalization;
using System.Text;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Strategies;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// Every counter of every built-in strategy, pixel by pixel, as the kernels counted before they were rebuilt on the
/// shared building blocks: the rebuild changes the code, never the modelled algorithm (docs/counters.md). Each line is
/// a strategy's total per counter and an FNV-1a hash of its per-pixel buffers and hits, captured from the kernels as
/// they stood on main (commit 3293714); <c>VOXPROF_PRINT_PINS=FILE</c> writes the lines again. The lines traced with
/// the prepass (p4) were captured again when the coarse ray moved from walking the tree to the tree's coarse occupancy
/// grids: its look-ups (prepass-node-fetches) and, where the grids stop above the voxels, its start distances changed;
/// no hit did (the hit hashes are the old ones). They were captured once more when the grids gained a sparse level
/// below the finest dense one and the coarse ray stopped repeating look-ups it knew the answer to: again look-ups,
/// start distances and the pixels' own counts changed, no hit hash and no line without the prepass did. And once
/// more when a coarse stride went on to the exit of its cell grown by half the room while the cone is narrow
/// (docs/strategies.md): the p4 lines' prepass counts, start distances and own counts changed, their hit hashes did not.
/// And when the cone came to be measured at the block's corners with a rounding allowance: a few start distances, and
/// with them the p4 lines' own counts, moved; no hit hash did. And when the coarse rays came to run level by level from
/// 32-pixel blocks down, each searching for an empty grid level from where its enclosing block's ray would have: the
/// prepass counts and some start distances changed, no hit hash did.
/// </summary>
public class CountPinTests
{
    [Fact]
    public void Seeded_scenes_count_exactly_what_the_kernels_counted_before_the_rebuild()
    {
        var lines = new List<string>();
        foreach (int branching in new[] { 2, 4 })
        {
            for (int seed = 1; seed <= 3; seed++)
            {
                const int size = 40;
                BrickTree tree = DenseTree.Build(size, size - 7, size + 5, KernelAgreementTests.RandomBlobs(seed, size, 12), branching);
                Scene scene = DenseTree.SceneOf(size, size - 7, size + 5);
                var rng = new Random(seed * 17);
                for (int c = 0; c < 4; c++)
                {
                    CameraSpec cam = KernelAgreementTests.RandomCamera(rng, size, inside: c % 2 == 0);
                    int prepass = c == 3 ? 4 : 0;
                    lines.AddRange(Pins($"b{branching} s{seed} c{c} p{prepass}",
                        Tracer.Run(new TraceRequest(scene, tree, cam, 40, 28, [.. BuiltInStrategies.All], prepass, 2))));
                }
            }
        }
        Check(lines, SeededPins, "seeded");
    }

    [Fact]
    public void The_demo_scene_counts_exactly_what_the_kernels_counted_before_the_rebuild()
    {
        Scene scene = DemoTrees.Scene;
        var lines = new List<string>();
        foreach (int branching in new[] { 2, 4 })
        {
            BrickTree tree = DemoTrees.Tree(branching);
            foreach (CameraSpec cam in scene.Cameras)
            {
                int prepass = cam.Name == "main-street" ? 4 : 0;
                lines.AddRange(Pins($"b{branching} {cam.Name} p{prepass}",
                    Tracer.Run(new TraceRequest(scene, tree, cam, 48, 27, [.. BuiltInStrategies.All], prepass, 2))));
            }
        }
        Check(lines, DemoPins, "demo");
    }

    private static void Check(List<string> lines, string[] expected, string name)
    {
        if (Environment.GetEnvironmentVariable("VOXPROF_PRINT_PINS") is { Length: > 0 } file)
            File.AppendAllText(file, $"// {name}\n" + string.Concat(lines.Select(l => $"\"{l}\",\n")));
        lines.Should().Equal(expected);
    }

    /// <summary>One line per strategy: case, name, the total of each counter, and hashes of counters and hits.</summary>
    private static IEnumerable<string> Pins(string label, TraceRun run)
    {
        foreach (StrategyResult r in run.Results)
        {
            var totals = new StringBuilder();
            ulong hash = 14695981039346656037UL;
            // The eleven counters there were when the counts were pinned; the memory model's cache-lines has its own tests.
            for (int c = 0; c <= (int)Counter.PrepassSkip; c++)
            {
                long total = 0;
                foreach (uint v in r.Counters[c])
                {
                    total += v;
                    hash = Fnv(hash, v);
                }
                totals.Append(CultureInfo.InvariantCulture, $" {total}");
            }
            ulong hits = 14695981039346656037UL;
            foreach (PixelHit h in r.Hits)
            {
                hits = Fnv(hits, (uint)h.X);
                hits = Fnv(hits, (uint)h.Y);
                hits = Fnv(hits, (uint)h.Z);
                ulong t = (ulong)BitConverter.DoubleToInt64Bits(h.T);
                hits = Fnv(hits, (uint)t);
                hits = Fnv(hits, (uint)(t >> 32));
                hits = Fnv(hits, (uint)(h.Material | ((int)h.Face << 8) | (h.Hit ? 1 << 16 : 0)));
            }
            yield return $"{label} {r.Strategy.Name}{totals} {hash:x16} {hits:x16}";
        }
    }

    /// <summary>FNV-1a over the four bytes of a value (Fowler, Noll and Vo; IETF draft-eastlake-fnv).</summary>
    private static ulong Fnv(ulong hash, uint value)
    {
        for (int i = 0; i < 4; i++)
        {
            hash ^= (value >> (8 * i)) & 0xFF;
            hash *= 1099511628211UL;
        }
        return hash;
    }

    private static readonly string[] SeededPins =
    [
        "b2 s1 c0 p0 grid 20655 20531 1120 0 0 66948 0 0 0 0 0 63ccdf337f6ba8b1 0dc34a54e6453ffe",
        "b2 s1 c0 p0 slab 9481 7325 10477 4742 3390 5862 0 0 0 0 0 1a3526a195aa2362 0dc34a54e6453ffe",
        "b2 s1 c0 p0 dda 9481 7325 5862 4742 3390 5862 0 0 0 0 0 a9c2628686ef7c9f 0dc34a54e6453ffe",
        "b2 s1 c0 p0 dda-mask 7538 5404 5862 4742 3412 5862 8360 1418 0 0 0 4e3db97094cbecbb 0dc34a54e6453ffe",
        "b2 s1 c0 p0 hdda 9481 3935 1120 4742 3390 5862 0 0 0 0 0 3bbaa6646ce03369 0dc34a54e6453ffe",
        "b2 s1 c1 p0 grid 15335 15238 1120 0 0 43171 0 0 0 0 0 53941d10c03a366e aa58cbcfa2006288",
        "b2 s1 c1 p0 slab 5259 4165 6282 2549 1803 3030 0 0 0 0 0 a14ae5da39125157 aa58cbcfa2006288",
        "b2 s1 c1 p0 dda 5259 4165 3669 2549 1803 3030 0 0 0 0 0 de0580d33a6378d0 aa58cbcfa2006288",
        "b2 s1 c1 p0 dda-mask 4023 3087 3669 2549 1902 3030 4744 850 0 0 0 241e1c7a2b3d8539 aa58cbcfa2006288",
        "b2 s1 c1 p0 hdda 5259 2362 1120 2549 1803 3030 0 0 0 0 0 f216e5975e87803e aa58cbcfa2006288",
        "b2 s1 c2 p0 grid 72926 72580 1120 0 0 227038 0 0 0 0 0 d62de68c7c26d291 49155db6899d5605",
        "b2 s1 c2 p0 slab 23977 21187 24751 11438 9381 12558 0 0 0 0 0 a5fa66eb27e287a3 49155db6899d5605",
        "b2 s1 c2 p0 dda 23977 21187 12558 11438 9381 12558 0 0 0 0 0 84e706c24556172a 49155db6899d5605",
        "b2 s1 c2 p0 dda-mask 15551 13069 12558 11438 9627 12558 14730 5651 0 0 0 544e1dfe47f88853 49155db6899d5605",
        "b2 s1 c2 p0 hdda 23977 11806 1120 11438 9381 12558 0 0 0 0 0 bcb9874daa5434a7 49155db6899d5605",
        "b2 s1 c3 p4 grid 13513 13422 1120 0 0 38161 0 0 0 0 0 023aeaf5583d7d95 13ca0bfccea1b887",
        "b2 s1 c3 p4 slab 4367 3647 5396 2154 1631 2520 0 0 213 388 904 04f2f19813593ad3 13ca0bfccea1b887",
        "b2 s1 c3 p4 dda 4367 3647 3274 2154 1631 2520 0 0 213 388 904 acf20f9408bd1645 13ca0bfccea1b887",
        "b2 s1 c3 p4 dda-mask 3510 2820 3274 2154 1661 2520 3699 581 213 388 904 e753633a664be6bf 13ca0bfccea1b887",
        "b2 s1 c3 p4 hdda 4367 2016 1120 2154 1631 2520 0 0 213 388 904 eedef47b109971c6 13ca0bfccea1b887",
        "b2 s2 c0 p0 grid 40916 40378 1120 0 0 144798 0 0 0 0 0 e611cd16e5f28893 0d38508118c70272",
        "b2 s2 c0 p0 slab 18507 13688 19089 9161 5428 10281 0 0 0 0 0 a6996dc6f685f671 0d38508118c70272",
        "b2 s2 c0 p0 dda 18507 13688 10281 9161 5428 10281 0 0 0 0 0 b0b80a02b4ef1169 0d38508118c70272",
        "b2 s2 c0 p0 dda-mask 14761 10450 10281 9161 5936 10281 20949 2390 0 0 0 8c5deaad650a110c 0d38508118c70272",
        "b2 s2 c0 p0 hdda 18507 8260 1120 9161 5428 10281 0 0 0 0 0 831f9e463197f1fc 0d38508118c70272",
        "b2 s2 c1 p0 grid 13618 13441 1120 0 0 47175 0 0 0 0 0 a6fea7a617dd6f9c 3bad9b0cafe21749",
        "b2 s2 c1 p0 slab 6018 4883 6961 2955 2039 3463 0 0 0 0 0 7dc5a275802494f6 3bad9b0cafe21749",
        "b2 s2 c1 p0 dda 6018 4883 4075 2955 2039 3463 0 0 0 0 0 2a9f6bb5d2a67186 3bad9b0cafe21749",
        "b2 s2 c1 p0 dda-mask 5092 3999 4075 2955 2081 3463 6365 613 0 0 0 6a640f70eaf082e6 3bad9b0cafe21749",
        "b2 s2 c1 p0 hdda 6018 2844 1120 2955 2039 3463 0 0 0 0 0 b4963b48bcd0ad08 3bad9b0cafe21749",
        "b2 s2 c2 p0 grid 1120 0 1120 0 0 5600 0 0 0 0 0 28d41f4e56971025 f9f110e7b25c8925",
        "b2 s2 c2 p0 slab 5600 0 5600 4480 0 5600 0 0 0 0 0 65ac104502634c25 f9f110e7b25c8925",
        "b2 s2 c2 p0 dda 5600 0 5600 4480 0 5600 0 0 0 0 0 65ac104502634c25 f9f110e7b25c8925",
        "b2 s2 c2 p0 dda-mask 5600 0 5600 4480 0 5600 12520 0 0 0 0 6a1395386bb7f065 f9f110e7b25c8925",
        "b2 s2 c2 p0 hdda 5600 0 1120 4480 0 5600 0 0 0 0 0 d3b6b4f65a473825 f9f110e7b25c8925",
        "b2 s2 c3 p4 grid 9030 8978 1120 0 0 25859 0 0 0 0 0 29e287148e20dc58 759b97368ac4d225",
        "b2 s2 c3 p4 slab 2655 2132 3723 1303 920 1510 0 0 228 385 1286 cc6c148d3fd04399 759b97368ac4d225",
        "b2 s2 c3 p4 dda 2655 2132 2423 1303 920 1510 0 0 228 385 1286 365ceba1b685387f 759b97368ac4d225",
        "b2 s2 c3 p4 dda-mask 2100 1649 2423 1303 992 1510 2141 416 228 385 1286 a17a17bf999920ce 759b97368ac4d225",
        "b2 s2 c3 p4 hdda 2655 1212 1120 1303 920 1510 0 0 228 385 1286 dce09505ae54d75a 759b97368ac4d225",
        "b2 s3 c0 p0 grid 49625 49547 1120 0 0 140031 0 0 0 0 0 df6c9297e1684c67 8328baf04d48a873",
        "b2 s3 c0 p0 slab 13787 12919 14829 6640 5988 7760 0 0 0 0 0 14b97e8e83d6d148 8328baf04d48a873",
        "b2 s3 c0 p0 dda 13787 12919 7760 6640 5988 7760 0 0 0 0 0 08bdea92600004b1 8328baf04d48a873",
        "b2 s3 c0 p0 dda-mask 9822 9092 7760 6640 6126 7760 11156 2758 0 0 0 49e5be121f657f53 8328baf04d48a873",
        "b2 s3 c0 p0 hdda 13787 6931 1120 6640 5988 7760 0 0 0 0 0 3cc89f7ceac750f1 8328baf04d48a873",
        "b2 s3 c1 p0 grid 33609 33447 1120 0 0 102011 0 0 0 0 0 5ba16ce0c58e8957 0ab674770b3c3906",
        "b2 s3 c1 p0 slab 11216 8693 12174 5217 3424 5947 0 0 0 0 0 c5bd287c644ea556 0ab674770b3c3906",
        "b2 s3 c1 p0 dda 11216 8693 6337 5217 3424 5947 0 0 0 0 0 f72e2daf3ec3397d 0ab674770b3c3906",
        "b2 s3 c1 p0 dda-mask 8781 6820 6337 5217 3915 5947 5854 1760 0 0 0 7323e05cd1979c42 0ab674770b3c3906",
        "b2 s3 c1 p0 hdda 11216 5269 1120 5217 3424 5947 0 0 0 0 0 c7c450aa5472adaa 0ab674770b3c3906",
        "b2 s3 c2 p0 grid 42969 42844 1120 0 0 131407 0 0 0 0 0 b67dea1533ca9e53 86580f5b3c8daec8",
        "b2 s3 c2 p0 slab 15332 14217 16327 7244 6386 8364 0 0 0 0 0 61b58be4623f3de5 86580f5b3c8daec8",
        "b2 s3 c2 p0 dda 15332 14217 8364 7244 6386 8364 0 0 0 0 0 68552003d07a92ba 86580f5b3c8daec8",
        "b2 s3 c2 p0 dda-mask 9333 8350 8364 7244 6518 8364 11743 4024 0 0 0 7e607cee24cc6d3f 86580f5b3c8daec8",
        "b2 s3 c2 p0 hdda 15332 7831 1120 7244 6386 8364 0 0 0 0 0 007b71bbb4afce0a 86580f5b3c8daec8",
        "b2 s3 c3 p4 grid 38224 37931 1120 0 0 129898 0 0 0 0 0 9cf397274f6357b9 50635a5f9ce6fab8",
        "b2 s3 c3 p4 slab 14375 12066 15202 7280 5476 8197 0 0 461 787 6153 fa7466041f9924be 50635a5f9ce6fab8",
        "b2 s3 c3 p4 dda 14375 12066 8400 7280 5476 8197 0 0 461 787 6153 748106747872211e 50635a5f9ce6fab8",
        "b2 s3 c3 p4 dda-mask 11526 9429 8400 7280 5688 8197 9408 2033 461 787 6153 e5ff3f14d016076b 50635a5f9ce6fab8",
        "b2 s3 c3 p4 hdda 14375 6590 1120 7280 5476 8197 0 0 461 787 6153 222d26ef807700fe 50635a5f9ce6fab8",
        "b4 s1 c0 p0 grid 20655 20531 1120 0 0 38016 0 0 0 0 0 fb0373d249e2fbb5 0dc34a54e6453ffe",
        "b4 s1 c0 p0 slab 8740 7625 9736 1928 1617 3048 0 0 0 0 0 c55abdaa79254767 0dc34a54e6453ffe",
        "b4 s1 c0 p0 dda 8740 7625 3048 1928 1617 3048 0 0 0 0 0 a2ebd1b935945ca9 0dc34a54e6453ffe",
        "b4 s1 c0 p0 dda-mask 5034 3945 3048 1928 1643 3048 21836 1347 0 0 0 3429b037447e343e 0dc34a54e6453ffe",
        "b4 s1 c0 p0 hdda 8740 6008 1120 1928 1617 3048 0 0 0 0 0 c34c95553a4962de 0dc34a54e6453ffe",
        "b4 s1 c1 p0 grid 15335 15238 1120 0 0 25608 0 0 0 0 0 0864cb2c4ed01124 aa58cbcfa2006288",
        "b4 s1 c1 p0 slab 4941 4315 5964 1090 812 1571 0 0 0 0 0 462740dae0f75b96 aa58cbcfa2006288",
        "b4 s1 c1 p0 dda 4941 4315 2210 1090 812 1571 0 0 0 0 0 1c049f15e3a0a012 aa58cbcfa2006288",
        "b4 s1 c1 p0 dda-mask 3135 2673 2210 1090 866 1571 13067 682 0 0 0 d5094f68c3754e9b aa58cbcfa2006288",
        "b4 s1 c1 p0 hdda 4941 3503 1120 1090 812 1571 0 0 0 0 0 52fa2d63f97f9232 aa58cbcfa2006288",
        "b4 s1 c2 p0 grid 72926 72580 1120 0 0 133590 0 0 0 0 0 fb9295e9e736e94f 49155db6899d5605",
        "b4 s1 c2 p0 slab 23525 21969 24299 5170 4347 6290 0 0 0 0 0 5b274d3db61e904f 49155db6899d5605",
        "b4 s1 c2 p0 dda 23525 21969 6290 5170 4347 6290 0 0 0 0 0 650f8ea112bf1a08 49155db6899d5605",
        "b4 s1 c2 p0 dda-mask 10505 9257 6290 5170 4478 6290 41936 4051 0 0 0 0f3743c9045e014a 49155db6899d5605",
        "b4 s1 c2 p0 hdda 23525 17622 1120 5170 4347 6290 0 0 0 0 0 f5b5e7bd647a2e39 49155db6899d5605",
        "b4 s1 c3 p4 grid 13513 13422 1120 0 0 22438 0 0 0 0 0 a65b2ec95d62961c 13ca0bfccea1b887",
        "b4 s1 c3 p4 slab 4242 3827 5271 938 735 1329 0 0 185 259 275 03b130cfc5a046b4 13ca0bfccea1b887",
        "b4 s1 c3 p4 dda 4242 3827 2058 938 735 1329 0 0 185 259 275 787c672d16d18abb 13ca0bfccea1b887",
        "b4 s1 c3 p4 dda-mask 2724 2339 2058 938 765 1329 10176 514 185 259 275 549c936ab45f2ddd 13ca0bfccea1b887",
        "b4 s1 c3 p4 hdda 4242 3092 1120 938 735 1329 0 0 185 259 275 3766635e36f4cc7a 13ca0bfccea1b887",
        "b4 s2 c0 p0 grid 40916 40378 1120 0 0 86357 0 0 0 0 0 536bf17e3cda2558 0d38508118c70272",
        "b4 s2 c0 p0 slab 19068 16402 19650 4215 2635 5335 0 0 0 0 0 2e86076e3c3be932 0d38508118c70272",
        "b4 s2 c0 p0 dda 19068 16402 5335 4215 2635 5335 0 0 0 0 0 90e2ec05594b69a5 0d38508118c70272",
        "b4 s2 c0 p0 dda-mask 11161 9003 5335 4215 3143 5335 50254 2188 0 0 0 80c96d0b4be448b7 0d38508118c70272",
        "b4 s2 c0 p0 hdda 19068 13767 1120 4215 2635 5335 0 0 0 0 0 064e15308d17c913 0d38508118c70272",
        "b4 s2 c1 p0 grid 13618 13441 1120 0 0 27995 0 0 0 0 0 d2c7a155783d8d6f 3bad9b0cafe21749",
        "b4 s2 c1 p0 slab 5924 5312 6867 1339 946 1847 0 0 0 0 0 2d0060d45a9c2e76 3bad9b0cafe21749",
        "b4 s2 c1 p0 dda 5924 5312 2459 1339 946 1847 0 0 0 0 0 c5862cb81fea1880 3bad9b0cafe21749",
        "b4 s2 c1 p0 dda-mask 4527 3957 2459 1339 988 1847 14402 495 0 0 0 fbcc6ef5907ca6f9 3bad9b0cafe21749",
        "b4 s2 c1 p0 hdda 5924 4366 1120 1339 946 1847 0 0 0 0 0 c0eb3f9cb7538771 3bad9b0cafe21749",
        "b4 s2 c2 p0 grid 1120 0 1120 0 0 3360 0 0 0 0 0 c0d3913de208f225 f9f110e7b25c8925",
        "b4 s2 c2 p0 slab 3360 0 3360 2240 0 3360 0 0 0 0 0 226798c28c22d425 f9f110e7b25c8925",
        "b4 s2 c2 p0 dda 3360 0 3360 2240 0 3360 0 0 0 0 0 226798c28c22d425 f9f110e7b25c8925",
        "b4 s2 c2 p0 dda-mask 3360 0 3360 2240 0 3360 34335 0 0 0 0 acc4d17e78dfdce8 f9f110e7b25c8925",
        "b4 s2 c2 p0 hdda 3360 0 1120 2240 0 3360 0 0 0 0 0 6b624669e030de25 f9f110e7b25c8925",
        "b4 s2 c3 p4 grid 9030 8978 1120 0 0 15046 0 0 0 0 0 30c400925873d47f 759b97368ac4d225",
        "b4 s2 c3 p4 slab 2734 2440 3802 586 432 837 0 0 175 234 219 c0bec4fdfa62b264 759b97368ac4d225",
        "b4 s2 c3 p4 dda 2734 2440 1706 586 432 837 0 0 175 234 219 3d4f50cd9b075c6e 759b97368ac4d225",
        "b4 s2 c3 p4 dda-mask 1892 1649 1706 586 483 837 5844 326 175 234 219 58f948f7905218a4 759b97368ac4d225",
        "b4 s2 c3 p4 hdda 2734 2008 1120 586 432 837 0 0 175 234 219 17f49d392adc660e 759b97368ac4d225",
        "b4 s3 c0 p0 grid 49625 49547 1120 0 0 79039 0 0 0 0 0 9d5dd20787133af6 8328baf04d48a873",
        "b4 s3 c0 p0 slab 13318 12808 14360 3011 2717 4131 0 0 0 0 0 55aefdf607be1932 8328baf04d48a873",
        "b4 s3 c0 p0 dda 13318 12808 4131 3011 2717 4131 0 0 0 0 0 53c1f9b49a869663 8328baf04d48a873",
        "b4 s3 c0 p0 dda-mask 8276 7904 4131 3011 2855 4131 24224 1632 0 0 0 426a50dcf90d1239 8328baf04d48a873",
        "b4 s3 c0 p0 hdda 13318 10091 1120 3011 2717 4131 0 0 0 0 0 87c8e806af698935 8328baf04d48a873",
        "b4 s3 c1 p0 grid 33609 33447 1120 0 0 59541 0 0 0 0 0 21bafdb264900880 0ab674770b3c3906",
        "b4 s3 c1 p0 slab 11374 9825 12332 2395 1576 3125 0 0 0 0 0 9c7c177c36349e10 0ab674770b3c3906",
        "b4 s3 c1 p0 dda 11374 9825 3515 2395 1576 3125 0 0 0 0 0 f9432ad348bca539 0ab674770b3c3906",
        "b4 s3 c1 p0 dda-mask 7439 6457 3515 2395 2072 3125 15372 1558 0 0 0 e7e5fa00ee29bfc8 0ab674770b3c3906",
        "b4 s3 c1 p0 hdda 11374 8249 1120 2395 1576 3125 0 0 0 0 0 85e2a61e1d9a218e 0ab674770b3c3906",
        "b4 s3 c2 p0 grid 42969 42844 1120 0 0 75878 0 0 0 0 0 d4a9dfe4ae77773e 86580f5b3c8daec8",
        "b4 s3 c2 p0 slab 13780 13141 14775 2490 2108 3610 0 0 0 0 0 0ea97ef174a679b1 86580f5b3c8daec8",
        "b4 s3 c2 p0 dda 13780 13141 3610 2490 2108 3610 0 0 0 0 0 abeb673daecb58f2 86580f5b3c8daec8",
        "b4 s3 c2 p0 dda-mask 6385 5878 3610 2490 2240 3610 22801 2001 0 0 0 6dad8709f15f5342 86580f5b3c8daec8",
        "b4 s3 c2 p0 hdda 13780 11033 1120 2490 2108 3610 0 0 0 0 0 7f4378134b6a182e 86580f5b3c8daec8",
        "b4 s3 c3 p4 grid 38224 37931 1120 0 0 77797 0 0 0 0 0 ac2307b21fce398b 50635a5f9ce6fab8",
        "b4 s3 c3 p4 slab 14977 13683 15804 3524 2735 4441 0 0 389 609 3344 9157bc1db7ee5909 50635a5f9ce6fab8",
        "b4 s3 c3 p4 dda 14977 13683 4644 3524 2735 4441 0 0 389 609 3344 fde9355516912a51 50635a5f9ce6fab8",
        "b4 s3 c3 p4 dda-mask 10578 9496 4644 3524 2947 4441 20732 1537 389 609 3344 91ae467fea62ab90 50635a5f9ce6fab8",
        "b4 s3 c3 p4 hdda 14977 10948 1120 3524 2735 4441 0 0 389 609 3344 3f952496502b38f8 50635a5f9ce6fab8",
    ];

    private static readonly string[] DemoPins =
    [
        "b2 main-street p4 grid 587393 586378 1296 0 0 2931950 0 0 0 0 0 203d3558d593b301 cd3e7e1cb085c89f",
        "b2 main-street p4 slab 36836 26127 37117 21933 12462 23229 0 0 729 1208 75340 010432815a6022d6 cd3e7e1cb085c89f",
        "b2 main-street p4 dda 36836 26127 23229 21933 12462 23229 0 0 729 1208 75340 c726e8d5664c6b92 cd3e7e1cb085c89f",
        "b2 main-street p4 dda-mask 30157 19671 23229 21933 12685 23229 59515 4334 729 1208 75340 fd202895db0620fc cd3e7e1cb085c89f",
        "b2 main-street p4 hdda 36836 13665 1296 21933 12462 23229 0 0 729 1208 75340 33d2ed2534dfb6c1 cd3e7e1cb085c89f",
        "b2 hill-overview p0 grid 1728989 1728077 1296 0 0 6423270 0 0 0 0 0 5f4d92f89aa4d29d 77cab17397428da5",
        "b2 hill-overview p0 slab 48395 38979 48779 24910 16454 26206 0 0 0 0 0 86b65bd3bead0eef 77cab17397428da5",
        "b2 hill-overview p0 dda 48395 38979 26206 24910 16454 26206 0 0 0 0 0 1b33f0aabec11a2d 77cab17397428da5",
        "b2 hill-overview p0 dda-mask 45662 36294 26206 24910 16502 26206 39715 1695 0 0 0 2087ae502c7adecb 77cab17397428da5",
        "b2 hill-overview p0 hdda 48395 22525 1296 24910 16454 26206 0 0 0 0 0 2393b51635d25832 77cab17397428da5",
        "b2 horizon-graze p0 grid 2077489 2076845 1296 0 0 8501594 0 0 0 0 0 94331361a5e67d13 33be15c842996513",
        "b2 horizon-graze p0 slab 75695 68075 76347 37129 30563 38425 0 0 0 0 0 78619c395a84db1f 33be15c842996513",
        "b2 horizon-graze p0 dda 75695 68075 38425 37129 30563 38425 0 0 0 0 0 d716af8954103f25 33be15c842996513",
        "b2 horizon-graze p0 dda-mask 63732 56522 38425 37129 30973 38425 57792 6671 0 0 0 1ae26a7c7607a75c 33be15c842996513",
        "b2 horizon-graze p0 hdda 75695 37512 1296 37129 30563 38425 0 0 0 0 0 26ccecdd2a64bb39 33be15c842996513",
        "b2 stone-bridge p0 grid 290443 289289 1296 0 0 1454561 0 0 0 0 0 8badc93b1e707a3b 167509eb45a1d22d",
        "b2 stone-bridge p0 slab 33248 22121 33390 21139 11284 22435 0 0 0 0 0 86a5cd937ad524a3 167509eb45a1d22d",
        "b2 stone-bridge p0 dda 33248 22121 22435 21139 11284 22435 0 0 0 0 0 9fe413205fb5b1dd 167509eb45a1d22d",
        "b2 stone-bridge p0 dda-mask 29788 18779 22435 21139 11402 22435 60595 2396 0 0 0 3f71e42ae9273307 167509eb45a1d22d",
        "b2 stone-bridge p0 hdda 33248 10837 1296 21139 11284 22435 0 0 0 0 0 c8f899b0b3a03efd 167509eb45a1d22d",
        "b2 spoil-heaps p0 grid 612443 611250 1296 0 0 3588360 0 0 0 0 0 f017a30f2b47c2ae 3bb76a82e3c95798",
        "b2 spoil-heaps p0 slab 64357 52232 64460 34821 23889 36117 0 0 0 0 0 053eee0b2e7d805d 3bb76a82e3c95798",
        "b2 spoil-heaps p0 dda 64357 52232 36117 34821 23889 36117 0 0 0 0 0 4bb7e7c187a4f21f 3bb76a82e3c95798",
        "b2 spoil-heaps p0 dda-mask 59260 47135 36117 34821 23889 36117 61427 3286 0 0 0 7007af0e934dee2b 3bb76a82e3c95798",
        "b2 spoil-heaps p0 hdda 64357 28343 1296 34821 23889 36117 0 0 0 0 0 be520c92c107a2c1 3bb76a82e3c95798",
        "b4 main-street p4 grid 587393 586378 1296 0 0 1869379 0 0 0 0 0 9ae6437088e509eb cd3e7e1cb085c89f",
        "b4 main-street p4 slab 33770 27380 34051 11889 6795 13185 0 0 719 1067 45852 3f14dd61d0e14a7d cd3e7e1cb085c89f",
        "b4 main-street p4 dda 33770 27380 13185 11889 6795 13185 0 0 719 1067 45852 bc2a23380e6d211d cd3e7e1cb085c89f",
        "b4 main-street p4 dda-mask 23655 17546 13185 11889 7018 13185 253217 3645 719 1067 45852 3556693aec7fe4df cd3e7e1cb085c89f",
        "b4 main-street p4 hdda 33770 20585 1296 11889 6795 13185 0 0 719 1067 45852 490cf5aaf1326463 cd3e7e1cb085c89f",
        "b4 hill-overview p0 grid 1728989 1728077 1296 0 0 4250368 0 0 0 0 0 3b923543bd87b2bb 77cab17397428da5",
        "b4 hill-overview p0 slab 44273 38607 44657 12490 8120 13786 0 0 0 0 0 61b1e440c0d281eb 77cab17397428da5",
        "b4 hill-overview p0 dda 44273 38607 13786 12490 8120 13786 0 0 0 0 0 37b972932c0b4dab 77cab17397428da5",
        "b4 hill-overview p0 dda-mask 39821 34539 13786 12490 8168 13786 163481 1684 0 0 0 787b4511589697b5 77cab17397428da5",
        "b4 hill-overview p0 hdda 44273 30487 1296 12490 8120 13786 0 0 0 0 0 b1f28f2833def8c2 77cab17397428da5",
        "b4 horizon-graze p0 grid 2077489 2076845 1296 0 0 5514718 0 0 0 0 0 a1a2ed12eb0d3065 33be15c842996513",
        "b4 horizon-graze p0 slab 75471 70603 76123 18487 14915 19783 0 0 0 0 0 ff11fa1fc20ad51d 33be15c842996513",
        "b4 horizon-graze p0 dda 75471 70603 19783 18487 14915 19783 0 0 0 0 0 036bab73aa8e9b3c 33be15c842996513",
        "b4 horizon-graze p0 dda-mask 58129 53913 19783 18487 15325 19783 222683 4846 0 0 0 25ac4ed5fe2da1c0 33be15c842996513",
        "b4 horizon-graze p0 hdda 75471 55688 1296 18487 14915 19783 0 0 0 0 0 54f9c897f72ebec5 33be15c842996513",
        "b4 stone-bridge p0 grid 290443 289289 1296 0 0 885555 0 0 0 0 0 e83762f265fa6d8a 167509eb45a1d22d",
        "b4 stone-bridge p0 slab 26151 19701 26293 10544 5366 11840 0 0 0 0 0 5a358c1bfba91e72 167509eb45a1d22d",
        "b4 stone-bridge p0 dda 26151 19701 11840 10544 5366 11840 0 0 0 0 0 84396beea0ae01f5 167509eb45a1d22d",
        "b4 stone-bridge p0 dda-mask 22642 16310 11840 10544 5484 11840 271435 1437 0 0 0 3c3505e7e393c1a1 167509eb45a1d22d",
        "b4 stone-bridge p0 hdda 26151 14335 1296 10544 5366 11840 0 0 0 0 0 062deb9e80e684c7 167509eb45a1d22d",
        "b4 spoil-heaps p0 grid 612443 611250 1296 0 0 2181020 0 0 0 0 0 b8ded16819dd29de 3bb76a82e3c95798",
        "b4 spoil-heaps p0 slab 55410 48654 55513 16136 10573 17432 0 0 0 0 0 ed18e235944d4656 3bb76a82e3c95798",
        "b4 spoil-heaps p0 dda 55410 48654 17432 16136 10573 17432 0 0 0 0 0 aefeea2cdd12c73d 3bb76a82e3c95798",
        "b4 spoil-heaps p0 dda-mask 51179 44423 17432 16136 10573 17432 244428 1364 0 0 0 9aab11824884d245 3bb76a82e3c95798",
        "b4 spoil-heaps p0 hdda 55410 38081 1296 16136 10573 17432 0 0 0 0 0 5f7b95495d22f4e3 3bb76a82e3c95798",
    ];
}
