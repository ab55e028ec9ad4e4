using System.Collections.Immutable;
using System.Reflection;
using System.Reflection.Emit;
using System.Reflection.Metadata;
using System.Reflection.Metadata.Ecma335;
using System.Reflection.PortableExecutable;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Strategies;

/// <summary>
/// <see cref="FixedBranchingCheck"/>'s rule for a built library, which has no source to read: every method body's
/// tokens (calls, field and type references) are decoded, and a generic method or type instantiated with one of
/// VoxProf's branching types (<c>IsOccupied&lt;Branching4&gt;</c>, <c>NodeCells&lt;Branching8&gt;</c>) is refused,
/// naming the method that does it. The library's metadata is read as data (System.Reflection.Metadata, ECMA-335
/// II.22–23 tables and signatures, III.1.2 opcodes), before any of its code runs.
/// </summary>
internal static class FixedBranchingIl
{
    /// <summary>VoxProf's branching types by full name (a library's own IBranching types are found by their interface).</summary>
    private static readonly ImmutableHashSet<string> Branchings = [.. typeof(IBranching).Assembly.GetTypes()
        .Where(t => t.IsValueType && typeof(IBranching).IsAssignableFrom(t)).Select(t => t.FullName!)];

    /// <summary>Operand sizes from the runtime's own opcode table, by opcode value.</summary>
    private static readonly Dictionary<ushort, OperandType> Operands = typeof(OpCodes)
        .GetFields(BindingFlags.Public | BindingFlags.Static)
        .Select(f => (OpCode)f.GetValue(null)!)
        .ToDictionary(o => unchecked((ushort)o.Value), o => o.OperandType);

    /// <summary>"FILE: error: TYPE.METHOD names CALLEE&lt;BranchingN&gt;, …" for each method that fixes a branching (one line each).</summary>
    public static IReadOnlyList<string> Problems(string path, string source)
    {
        using var stream = File.OpenRead(path);
        using var pe = new PEReader(stream);
        if (!pe.HasMetadata)
            return [];
        MetadataReader md = pe.GetMetadataReader();
        var names = new Names(md);
        var problems = new List<string>();
        foreach (TypeDefinitionHandle th in md.TypeDefinitions)
        {
            TypeDefinition type = md.GetTypeDefinition(th);
            foreach (MethodDefinitionHandle mh in type.GetMethods())
            {
                MethodDefinition method = md.GetMethodDefinition(mh);
                if (method.RelativeVirtualAddress == 0)
                    continue;
                names.Within(type, method);
                var found = new SortedSet<string>(StringComparer.Ordinal);
                BlobReader il = pe.GetMethodBody(method.RelativeVirtualAddress).GetILReader();
                while (il.RemainingBytes > 0)
                {
                    if (NextToken(ref il) is { } token && names.Fixed(token) is { } name)
                        found.Add(name);
                }
                foreach (string name in found)
                {
                    problems.Add($"{source}: error: {md.GetString(type.Name)}.{md.GetString(method.Name)} names {name}, which fixes the branching; " +
                        "pass the TBranching type parameter Trace was given, which is the traced tree's (a fixed one reads the wrong node records on a tree of another branching)");
                }
            }
        }
        return problems;
    }

    /// <summary>Reads one instruction; its metadata token when its operand is one (calls, fields, types, ldtoken).</summary>
    private static EntityHandle? NextToken(ref BlobReader il)
    {
        ushort value = il.ReadByte();
        if (value == 0xFE)
            value = (ushort)(0xFE00 | il.ReadByte());
        switch (Operands.GetValueOrDefault(value, OperandType.InlineNone))
        {
            case OperandType.InlineField or OperandType.InlineMethod or OperandType.InlineTok or OperandType.InlineType:
                return MetadataTokens.EntityHandle(il.ReadInt32());
            case OperandType.InlineSwitch:
                // The count first, then the targets: `Offset += 4 * ReadInt32()` would read Offset before the count.
                int targets = il.ReadInt32();
                il.Offset += 4 * targets;
                return null;
            case OperandType.ShortInlineBrTarget or OperandType.ShortInlineI or OperandType.ShortInlineVar:
                il.Offset += 1;
                return null;
            case OperandType.InlineVar:
                il.Offset += 2;
                return null;
            case OperandType.InlineI8 or OperandType.InlineR:
                il.Offset += 8;
                return null;
            case OperandType.InlineNone:
                return null;
            default:
                il.Offset += 4;
                return null;
        }
    }

    /// <summary>Names of the entities a token refers to, in C#'s own spelling, flagging branching type arguments.</summary>
    private sealed class Names(MetadataReader md) : ISignatureTypeProvider<string, object?>
    {
        private bool _fixed;
        private string[] _typeParameters = [], _methodParameters = [];

        /// <summary>The method whose body is read next: its type parameters are named as the source names them (TCounters).</summary>
        public void Within(TypeDefinition type, MethodDefinition method)
        {
            _typeParameters = [.. type.GetGenericParameters().Select(p => md.GetString(md.GetGenericParameter(p).Name))];
            _methodParameters = [.. method.GetGenericParameters().Select(p => md.GetString(md.GetGenericParameter(p).Name))];
        }

        /// <summary>"IsOccupied&lt;Branching4&gt;" when the token instantiates something with a branching type; else null.</summary>
        public string? Fixed(EntityHandle token)
        {
            _fixed = false;
            string? name = token.Kind switch
            {
                HandleKind.MethodSpecification => MethodSpec((MethodSpecificationHandle)token),
                HandleKind.MemberReference => Member((MemberReferenceHandle)token),
                HandleKind.TypeSpecification => md.GetTypeSpecification((TypeSpecificationHandle)token).DecodeSignature(this, null),
                _ => null,
            };
            return _fixed ? name : null;
        }

        private string MethodSpec(MethodSpecificationHandle handle)
        {
            MethodSpecification spec = md.GetMethodSpecification(handle);
            string arguments = string.Join(", ", spec.DecodeSignature(this, null));
            if (spec.Method.Kind != HandleKind.MemberReference)
            {
                MethodDefinition own = md.GetMethodDefinition((MethodDefinitionHandle)spec.Method);
                return $"{md.GetString(md.GetTypeDefinition(own.GetDeclaringType()).Name)}.{md.GetString(own.Name)}<{arguments}>";
            }
            MemberReference member = md.GetMemberReference((MemberReferenceHandle)spec.Method);
            return $"{Owner(member.Parent)}{md.GetString(member.Name)}<{arguments}>";
        }

        /// <summary>A field or non-generic method of a generic type's instance: "NodeCells&lt;Branching8&gt;.Bit".</summary>
        private string Member(MemberReferenceHandle handle)
        {
            MemberReference member = md.GetMemberReference(handle);
            string name = md.GetString(member.Name);
            return $"{Owner(member.Parent)}{(name.StartsWith("get_", StringComparison.Ordinal) ? name[4..] : name)}";
        }

        /// <summary>"TYPE." or "TYPE&lt;ARGS&gt;." of the type a member belongs to.</summary>
        private string Owner(EntityHandle parent) => parent.Kind switch
        {
            HandleKind.TypeSpecification => md.GetTypeSpecification((TypeSpecificationHandle)parent).DecodeSignature(this, null) + ".",
            HandleKind.TypeReference => md.GetString(md.GetTypeReference((TypeReferenceHandle)parent).Name) + ".",
            HandleKind.TypeDefinition => md.GetString(md.GetTypeDefinition((TypeDefinitionHandle)parent).Name) + ".",
            _ => "",
        };

        public string GetGenericInstantiation(string genericType, ImmutableArray<string> typeArguments) =>
            $"{genericType.Split('`')[0]}<{string.Join(", ", typeArguments)}>";

        /// <summary>The library's own type; one that implements IBranching fixes the branching as VoxProf's do.</summary>
        public string GetTypeFromDefinition(MetadataReader reader, TypeDefinitionHandle handle, byte rawTypeKind)
        {
            TypeDefinition type = reader.GetTypeDefinition(handle);
            foreach (InterfaceImplementationHandle i in type.GetInterfaceImplementations())
            {
                if (reader.GetInterfaceImplementation(i).Interface is { Kind: HandleKind.TypeReference } face
                    && reader.GetTypeReference((TypeReferenceHandle)face) is var r
                    && $"{reader.GetString(r.Namespace)}.{reader.GetString(r.Name)}" == typeof(IBranching).FullName)
                    _fixed = true;
            }
            return reader.GetString(type.Name);
        }

        public string GetTypeFromReference(MetadataReader reader, TypeReferenceHandle handle, byte rawTypeKind)
        {
            TypeReference type = reader.GetTypeReference(handle);
            string name = reader.GetString(type.Name);
            if (Branchings.Contains($"{reader.GetString(type.Namespace)}.{name}"))
                _fixed = true;
            return name;
        }

        public string GetTypeFromSpecification(MetadataReader reader, object? context, TypeSpecificationHandle handle, byte rawTypeKind) =>
            reader.GetTypeSpecification(handle).DecodeSignature(this, context);

        public string GetPrimitiveType(PrimitiveTypeCode typeCode) => typeCode.ToString();
        public string GetSZArrayType(string elementType) => elementType + "[]";
        public string GetArrayType(string elementType, ArrayShape shape) => elementType + "[" + new string(',', shape.Rank - 1) + "]";
        public string GetByReferenceType(string elementType) => "ref " + elementType;
        public string GetPointerType(string elementType) => elementType + "*";
        public string GetPinnedType(string elementType) => elementType;
        public string GetModifiedType(string modifier, string unmodifiedType, bool isRequired) => unmodifiedType;
        public string GetFunctionPointerType(MethodSignature<string> signature) => "delegate*";
        public string GetGenericMethodParameter(object? context, int index) => index < _methodParameters.Length ? _methodParameters[index] : $"!!{index}";
        public string GetGenericTypeParameter(object? context, int index) => index < _typeParameters.Length ? _typeParameters[index] : $"!{index}";
    }
}
